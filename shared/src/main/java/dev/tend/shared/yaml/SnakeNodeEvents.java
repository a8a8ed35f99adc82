package dev.tend.shared.yaml;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.yaml.snakeyaml.DumperOptions;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.events.AliasEvent;
import org.yaml.snakeyaml.events.Event;
import org.yaml.snakeyaml.events.MappingStartEvent;
import org.yaml.snakeyaml.events.ScalarEvent;
import org.yaml.snakeyaml.events.SequenceStartEvent;
import org.yaml.snakeyaml.parser.Parser;
import org.yaml.snakeyaml.parser.ParserImpl;
import org.yaml.snakeyaml.reader.StreamReader;

import java.io.IOException;
import java.io.Reader;
import java.io.UncheckedIOException;

/** YAML (and so JSON) through SnakeYAML's event parser: no node tree is ever built. */
final class SnakeNodeEvents implements NodeEvents {
    private final String source;
    private final Reader reader;
    private final Parser parser;
    private boolean ended;
    private boolean seenDocument;

    /** {@code codePoints}: the document's size, so that the parser's input limit fits the file instead of a fixed 3 MB. */
    SnakeNodeEvents(String source, Reader reader, long codePoints) {
        this.source = source;
        this.reader = reader;
        LoaderOptions options = new LoaderOptions();
        options.setCodePointLimit((int) Math.min(Integer.MAX_VALUE, Math.max(codePoints + 1, options.getCodePointLimit())));
        this.parser = new ParserImpl(new StreamReader(reader), options);
    }

    @Override
    public NodeEvent next() {
        if (ended) return NodeEvent.of(NodeEvent.Type.END, null, 0, 0);
        try {
            while (true) {
                Event e = parser.getEvent();
                Mark m = e.getStartMark();
                int line = m == null ? 0 : m.getLine() + 1;
                int col = m == null ? 0 : m.getColumn() + 1;
                switch (e.getEventId()) {
                    case MappingStart:
                        return NodeEvent.of(NodeEvent.Type.MAP_START, ((MappingStartEvent) e).getAnchor(), line, col);
                    case MappingEnd:
                        return NodeEvent.of(NodeEvent.Type.MAP_END, null, line, col);
                    case SequenceStart:
                        return NodeEvent.of(NodeEvent.Type.LIST_START, ((SequenceStartEvent) e).getAnchor(), line, col);
                    case SequenceEnd:
                        return NodeEvent.of(NodeEvent.Type.LIST_END, null, line, col);
                    case Scalar: {
                        ScalarEvent s = (ScalarEvent) e;
                        boolean quoted = s.getScalarStyle() != DumperOptions.ScalarStyle.PLAIN;
                        String v = s.getValue();
                        boolean nul = !quoted && (v.isEmpty() || v.equals("~") || v.equals("null") || v.equals("Null")
                                || v.equals("NULL"));
                        return new NodeEvent(NodeEvent.Type.SCALAR, v, quoted, nul, s.getAnchor(), line, col);
                    }
                    case Alias:
                        return new NodeEvent(NodeEvent.Type.ALIAS, ((AliasEvent) e).getAnchor(), false, false, null, line, col);
                    case StreamEnd:
                        ended = true;
                        return NodeEvent.of(NodeEvent.Type.END, null, line, col);
                    case DocumentStart:
                        if (((org.yaml.snakeyaml.events.DocumentStartEvent) e).getExplicit() && seenDocument) {
                            throw new InvalidInputException(Problem.at(source, line, col, "",
                                    "this is not valid YAML: the file holds more than one document; keep one"));
                        }
                        seenDocument = true;
                        break;
                    default:
                        break; // stream start, document end, comments
                }
            }
        } catch (MarkedYAMLException e) {
            Mark m = e.getProblemMark() != null ? e.getProblemMark() : e.getContextMark();
            int line = m == null ? 0 : m.getLine() + 1;
            int col = m == null ? 0 : m.getColumn() + 1;
            String what = e.getProblem() != null ? e.getProblem() : e.getMessage();
            throw new InvalidInputException(Problem.at(source, line, col, "", "this is not valid YAML: " + what));
        } catch (YAMLException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "this is not valid YAML: " + e.getMessage()));
        } catch (UncheckedIOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read: " + e.getMessage()));
        }
    }

    @Override
    public void close() {
        try {
            reader.close();
        } catch (IOException ignored) {
            // reading is over; nothing was written
        }
    }
}
