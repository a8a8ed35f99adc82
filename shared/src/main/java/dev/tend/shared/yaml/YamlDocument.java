package dev.tend.shared.yaml;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
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
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Parses one YAML or JSON document into a located {@link YNode} tree. Syntax errors and
 * duplicate keys are thrown as {@link InvalidInputException}, each problem located.
 */
public final class YamlDocument {
    private YamlDocument() {
    }

    public static YNode read(Path file) {
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "cannot read the file: " + e.getMessage()));
        }
        return parse(file.toString(), text);
    }

    /**
     * Parses {@code text}, naming it {@code source} in problems. An empty document is an
     * empty mapping at 1:1.
     */
    public static YNode parse(String source, String text) {
        LoaderOptions options = new LoaderOptions();
        options.setAllowDuplicateKeys(true); // found and reported below, all at once
        options.setMaxAliasesForCollections(50);
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
        } catch (YAMLException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "this is not valid YAML: " + e.getMessage()));
        } catch (UncheckedIOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read: " + e.getMessage()));
        }
        if (root == null) return new YMap(List.of(), 1, 1);
        List<Problem> problems = new ArrayList<>();
        YNode tree = convert(source, root, problems);
        if (!problems.isEmpty()) throw new InvalidInputException(problems);
        return tree;
    }

    private static YNode convert(String source, Node node, List<Problem> problems) {
        int line = node.getStartMark().getLine() + 1;
        int col = node.getStartMark().getColumn() + 1;
        if (node instanceof ScalarNode s) {
            boolean quoted = s.getScalarStyle() != DumperOptions.ScalarStyle.PLAIN;
            String v = s.getValue();
            boolean nul = !quoted && (v.isEmpty() || v.equals("~") || v.equals("null") || v.equals("Null") || v.equals("NULL"));
            return new YScalar(v, nul, quoted, line, col);
        }
        if (node instanceof SequenceNode seq) {
            List<YNode> items = new ArrayList<>();
            for (Node n : seq.getValue()) items.add(convert(source, n, problems));
            return new YList(items, line, col);
        }
        MappingNode map = (MappingNode) node;
        List<YMap.Entry> entries = new ArrayList<>();
        Map<String, YScalar> seen = new HashMap<>();
        for (NodeTuple t : map.getValue()) {
            YNode k = convert(source, t.getKeyNode(), problems);
            YNode v = convert(source, t.getValueNode(), problems);
            if (!(k instanceof YScalar key)) {
                problems.add(Problem.at(source, k.line(), k.column(), "", "a key must be a plain word, not " + k.kind()));
                continue;
            }
            YScalar first = seen.putIfAbsent(key.value(), key);
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
