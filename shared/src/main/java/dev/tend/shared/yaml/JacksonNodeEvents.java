package dev.tend.shared.yaml;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

import java.io.IOException;
import java.io.Reader;

/**
 * JSON through Jackson's streaming parser: a large fleet file is read token by token, with
 * each token's line and column. Object keys become scalars, as in YAML.
 */
final class JacksonNodeEvents implements NodeEvents {
    private static final JsonFactory FACTORY = JsonFactory.builder().build();

    private final String source;
    private final JsonParser parser;
    private boolean ended;

    JacksonNodeEvents(String source, Reader reader) {
        this.source = source;
        try {
            this.parser = FACTORY.createParser(reader);
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read: " + e.getMessage()));
        }
    }

    @Override
    public NodeEvent next() {
        if (ended) return NodeEvent.of(NodeEvent.Type.END, null, 0, 0);
        try {
            JsonToken t = parser.nextToken();
            if (t == null) {
                ended = true;
                return NodeEvent.of(NodeEvent.Type.END, null, 0, 0);
            }
            JsonLocation at = parser.currentTokenLocation();
            int line = at.getLineNr();
            int col = at.getColumnNr();
            return switch (t) {
                case START_OBJECT -> NodeEvent.of(NodeEvent.Type.MAP_START, null, line, col);
                case END_OBJECT -> NodeEvent.of(NodeEvent.Type.MAP_END, null, line, col);
                case START_ARRAY -> NodeEvent.of(NodeEvent.Type.LIST_START, null, line, col);
                case END_ARRAY -> NodeEvent.of(NodeEvent.Type.LIST_END, null, line, col);
                case FIELD_NAME -> new NodeEvent(NodeEvent.Type.SCALAR, parser.currentName(), true, false, null, line, col);
                case VALUE_STRING -> new NodeEvent(NodeEvent.Type.SCALAR, parser.getText(), true, false, null, line, col);
                case VALUE_NULL -> new NodeEvent(NodeEvent.Type.SCALAR, "null", false, true, null, line, col);
                default -> new NodeEvent(NodeEvent.Type.SCALAR, parser.getText(), false, false, null, line, col);
            };
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            throw new InvalidInputException(Problem.at(source, at == null ? 0 : at.getLineNr(), at == null ? 0 : at.getColumnNr(), "",
                    "this is not valid JSON: " + e.getOriginalMessage()));
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read: " + e.getMessage()));
        }
    }

    @Override
    public void close() {
        try {
            parser.close();
        } catch (IOException ignored) {
            // reading is over; nothing was written
        }
    }
}
