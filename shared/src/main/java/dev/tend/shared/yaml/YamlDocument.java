package dev.tend.shared.yaml;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.reader.ReaderException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;
import org.yaml.snakeyaml.DumperOptions;

import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.Set;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Parses one YAML or JSON document into a located {@link YNode} tree. Syntax errors and
 * duplicate keys are thrown as {@link InvalidInputException}, each problem located.
 *
 * <p>Aliases ({@code &name} ... {@code *name}) are bounded: an alias inside the very
 * mapping or list it names (a cycle) is refused, and so is a document whose aliases
 * would repeat more than {@value #MAX_ALIASED_VALUES} values in all (a chain of aliases
 * doubling at each step would otherwise fill the memory), so every file tend reads is
 * refused with a located problem in well under a second instead of exhausting the JVM.
 */
public final class YamlDocument {
    /** How many values all aliases of one document may repeat together. */
    public static final int MAX_ALIASED_VALUES = 10_000;
    /** How deeply mappings and lists may nest (common practice, no source: far beyond any tend file). */
    public static final int MAX_DEPTH = 200;

    private YamlDocument() {
    }

    public static YNode read(Path file) {
        byte[] bytes;
        try {
            bytes = Files.readAllBytes(file);
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "cannot read the file: " + e.getMessage()));
        }
        return parse(file.toString(), decode(file.toString(), bytes));
    }

    /**
     * The text of a file's bytes as UTF-8; a byte that is not UTF-8 is a problem located at
     * its line and column (counted in characters before it, bytes on its line).
     */
    public static String decode(String source, byte[] bytes) {
        java.nio.charset.CharsetDecoder d = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(java.nio.charset.CodingErrorAction.REPORT)
                .onUnmappableCharacter(java.nio.charset.CodingErrorAction.REPORT);
        java.nio.ByteBuffer in = java.nio.ByteBuffer.wrap(bytes);
        java.nio.CharBuffer out = java.nio.CharBuffer.allocate(bytes.length + 1);
        java.nio.charset.CoderResult r = d.decode(in, out, true);
        if (r.isError()) {
            int bad = in.position();
            int line = 1, lineStart = 0;
            for (int i = 0; i < bad; i++) {
                if (bytes[i] == '\n') {
                    line++;
                    lineStart = i + 1;
                }
            }
            throw new InvalidInputException(Problem.at(source, line, bad - lineStart + 1, "",
                    "this file is not valid UTF-8: the byte here cannot start or continue a character"));
        }
        d.flush(out);
        out.flip();
        return out.toString();
    }

    /**
     * Parses {@code text}, naming it {@code source} in problems. An empty document is an
     * empty mapping at 1:1.
     */
    public static YNode parse(String source, String text) {
        LoaderOptions options = new LoaderOptions();
        options.setAllowDuplicateKeys(true); // found and reported below, all at once
        options.setMaxAliasesForCollections(1000); // what they expand to is bounded below
        // SnakeYAML refuses input over 3 MB by default; the text is already in memory, so size the limit to it.
        options.setCodePointLimit(Math.max(options.getCodePointLimit(), text.length() + 1));
        Node root;
        try {
            root = new Yaml(options).compose(new StringReader(text));
        } catch (MarkedYAMLException e) {
            Mark m = e.getProblemMark() != null ? e.getProblemMark() : e.getContextMark();
            int line = m == null ? 0 : m.getLine() + 1;
            int col = m == null ? 0 : m.getColumn() + 1;
            String what = e.getProblem() != null ? e.getProblem() : e.getMessage();
            throw new InvalidInputException(Problem.at(source, line, col, "", "this is not valid YAML: " + what));
        } catch (ReaderException e) {
            throw new InvalidInputException(readerProblem(source, text, e));
        } catch (YAMLException e) {
            // failures without a mark (limits of the parser): the document as a whole, from its start
            throw new InvalidInputException(Problem.at(source, 1, 1, "", "this is not valid YAML: " + e.getMessage()));
        } catch (StackOverflowError e) {
            throw new InvalidInputException(Problem.at(source, 1, 1, "", "this document nests too deeply to be read"));
        } catch (UncheckedIOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read: " + e.getMessage()));
        }
        if (root == null) return new YMap(List.of(), 1, 1);
        List<Problem> problems = new ArrayList<>();
        YNode tree = new Converter(source, problems).convert(root, 0);
        if (!problems.isEmpty()) throw new InvalidInputException(problems);
        return tree;
    }

    /** Where a reader failure without a mark happened: its character index turned into line and column. */
    private static Problem readerProblem(String source, String text, ReaderException e) {
        int index = Math.max(0, Math.min(e.getPosition(), text.length()));
        int line = 1, col = 1;
        for (int i = 0; i < index; i++) {
            if (text.charAt(i) == '\n') {
                line++;
                col = 1;
            } else {
                col++;
            }
        }
        return Problem.at(source, line, col, "", "this is not valid YAML: character U+"
                + String.format("%04X", e.getCodePoint()) + " is not allowed in a YAML file");
    }

    /** Turns the composed node graph into a tree, following aliases within the bounds above. */
    private static final class Converter {
        private final String source;
        private final List<Problem> problems;
        private final Set<Node> open = Collections.newSetFromMap(new IdentityHashMap<>());
        private final Set<Node> seen = Collections.newSetFromMap(new IdentityHashMap<>());
        private int aliased;
        private int insideAlias;

        Converter(String source, List<Problem> problems) {
            this.source = source;
            this.problems = problems;
        }

        YNode convert(Node node, int depth) {
            int line = node.getStartMark().getLine() + 1;
            int col = node.getStartMark().getColumn() + 1;
            if (open.contains(node)) {
                throw new InvalidInputException(Problem.at(source, line, col, "",
                        "the anchor here is used by an alias inside its own value, which would never end; write the values out"));
            }
            if (depth > MAX_DEPTH) {
                throw new InvalidInputException(Problem.at(source, line, col, "",
                        "mappings and lists nest more than " + MAX_DEPTH + " deep here; tend files are far flatter"));
            }
            boolean repeat = !(node instanceof ScalarNode) && !seen.add(node);
            if (repeat || insideAlias > 0) {
                if (++aliased > MAX_ALIASED_VALUES) {
                    throw new InvalidInputException(Problem.at(source, line, col, "", "aliases (*name) in this document repeat more than "
                            + MAX_ALIASED_VALUES + " values; write the values out or use fewer aliases"));
                }
            }
            if (repeat) insideAlias++;
            open.add(node);
            try {
                return convertNode(node, line, col, depth);
            } finally {
                open.remove(node);
                if (repeat) insideAlias--;
            }
        }

        private YNode convertNode(Node node, int line, int col, int depth) {
            if (node instanceof ScalarNode s) {
                boolean quoted = s.getScalarStyle() != DumperOptions.ScalarStyle.PLAIN;
                String v = s.getValue();
                boolean nul = !quoted && (v.isEmpty() || v.equals("~") || v.equals("null") || v.equals("Null") || v.equals("NULL"));
                return new YScalar(v, nul, quoted, line, col);
            }
            if (node instanceof SequenceNode seq) {
                List<YNode> items = new ArrayList<>();
                for (Node n : seq.getValue()) items.add(convert(n, depth + 1));
                return new YList(items, line, col);
            }
            MappingNode map = (MappingNode) node;
            List<YMap.Entry> entries = new ArrayList<>();
            Map<String, YScalar> keys = new HashMap<>();
            for (NodeTuple t : map.getValue()) {
                YNode k = convert(t.getKeyNode(), depth + 1);
                YNode v = convert(t.getValueNode(), depth + 1);
                if (!(k instanceof YScalar key)) {
                    problems.add(Problem.at(source, k.line(), k.column(), "", "a key must be a plain word, not " + k.kind()));
                    continue;
                }
                YScalar first = keys.putIfAbsent(key.value(), key);
                if (first != null) {
                    problems.add(Problem.at(source, key.line(), key.column(), key.value(),
                            "'" + key.value() + "' is given twice; the first is at line " + first.line()));
                    continue;
                }
                entries.add(new YMap.Entry(key, v));
            }
            return new YMap(entries, line, col);
        }
    }
}
