package dev.tend.shared.yaml;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Reads a large YAML or JSON document whose top level is a mapping with one long list (a
 * fleet file's {@code clusters}) without holding the whole document: each item of that
 * list is built as a located {@link YNode}, handed to the caller and dropped. Memory stays
 * that of one item plus what the caller keeps. A file named {@code *.json} goes through
 * Jackson's streaming parser, anything else through SnakeYAML's event parser with an input
 * limit sized to the file. The problems are those of {@link YamlDocument} (syntax errors,
 * duplicate keys), located the same way.
 */
public final class StreamedDocument {
    /** Receives the items of the streamed list in order, with their index. */
    @FunctionalInterface
    public interface ItemSink {
        void accept(int index, YNode item);
    }


    private final String source;
    private final NodeEvents events;
    private final List<Problem> problems = new ArrayList<>();
    private final Map<String, YNode> anchors = new HashMap<>();
    /** Anchors whose node is still being read: an alias to one of them would never end. */
    private final Map<String, NodeEvent> open = new HashMap<>();
    /** Values repeated by aliases so far, bounded as {@link YamlDocument} bounds them. */
    private int aliased;
    private int depth;

    private StreamedDocument(String source, NodeEvents events) {
        this.source = source;
        this.events = events;
    }

    /**
     * Reads {@code file}. When its top level is a mapping whose {@code listKey} holds a list,
     * each item goes to {@code sink} as it is read and the returned mapping holds an empty
     * list (located where the list was) under that key; otherwise the document is returned
     * whole. Throws {@link InvalidInputException} for a syntax error or duplicate keys
     * (problems the sink's items had are reported too, after the sink has seen them).
     */
    public static YNode read(Path file, String listKey, ItemSink sink) {
        String source = file.toString();
        long size;
        Reader reader;
        try {
            size = Files.size(file);
            Utf8Check.check(source, file);
            reader = Files.newBufferedReader(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(source, 0, 0, "", "cannot read the file: " + e.getMessage()));
        }
        boolean json = source.toLowerCase(Locale.ROOT).endsWith(".json");
        try (NodeEvents events = json ? new JacksonNodeEvents(source, reader) : new SnakeNodeEvents(source, reader, size)) {
            return new StreamedDocument(source, events).readTop(listKey, sink);
        }
    }

    private YNode readTop(String listKey, ItemSink sink) {
        NodeEvent first = events.next();
        if (first.type() == NodeEvent.Type.END) return new YMap(List.of(), 1, 1);
        YNode root;
        if (first.type() == NodeEvent.Type.MAP_START) {
            enter(first);
            root = mapping(first, listKey, sink);
        } else {
            root = node(first);
        }
        NodeEvent after = events.next();
        if (after.type() != NodeEvent.Type.END) {
            problems.add(Problem.at(source, after.line(), after.column(), "", "this is not valid YAML: the file holds more "
                    + "than one document; keep one"));
        }
        if (!problems.isEmpty()) throw new InvalidInputException(problems);
        return root;
    }

    /** A mapping; with {@code listKey} non-null, a list under that key is streamed to {@code sink}. */
    private YMap mapping(NodeEvent start, String listKey, ItemSink sink) {
        List<YMap.Entry> entries = new ArrayList<>();
        Map<String, YScalar> seen = new HashMap<>();
        while (true) {
            NodeEvent e = events.next();
            if (e.type() == NodeEvent.Type.MAP_END) break;
            if (e.type() == NodeEvent.Type.END) throw new IllegalStateException("the parser ended inside a mapping");
            YNode k = node(e);
            NodeEvent ve = events.next();
            YNode v;
            if (listKey != null && k instanceof YScalar ks && ks.value().equals(listKey) && !seen.containsKey(listKey)
                    && ve.type() == NodeEvent.Type.LIST_START && ve.anchor() == null) {
                int index = 0;
                for (NodeEvent ie = events.next(); ie.type() != NodeEvent.Type.LIST_END; ie = events.next()) {
                    sink.accept(index++, node(ie));
                }
                v = new YList(List.of(), ve.line(), ve.column());
            } else {
                v = node(ve);
            }
            if (!(k instanceof YScalar key)) {
                problems.add(Problem.at(source, k.line(), k.column(), "", "a key must be a plain word, not " + k.kind()));
                continue;
            }
            YScalar earlier = seen.putIfAbsent(key.value(), key);
            if (earlier != null) {
                problems.add(Problem.at(source, key.line(), key.column(), key.value(),
                        "'" + key.value() + "' is given twice; the first is at line " + earlier.line()));
                continue;
            }
            entries.add(new YMap.Entry(key, v));
        }
        return remember(start, new YMap(entries, start.line(), start.column()));
    }

    private YNode node(NodeEvent e) {
        switch (e.type()) {
            case SCALAR:
                return remember(e, new YScalar(e.value(), e.plainNull(), e.quoted(), e.line(), e.column()));
            case MAP_START:
                enter(e);
                return mapping(e, null, null);
            case LIST_START: {
                enter(e);
                List<YNode> items = new ArrayList<>();
                for (NodeEvent ie = events.next(); ie.type() != NodeEvent.Type.LIST_END; ie = events.next()) items.add(node(ie));
                return remember(e, new YList(items, e.line(), e.column()));
            }
            case ALIAS: {
                NodeEvent anchor = open.get(e.value());
                if (anchor != null) {
                    throw new InvalidInputException(Problem.at(source, anchor.line(), anchor.column(), "",
                            "the anchor here is used by an alias inside its own value, which would never end; write the values out"));
                }
                YNode target = anchors.get(e.value());
                if (target == null) {
                    throw new InvalidInputException(Problem.at(source, e.line(), e.column(), "",
                            "this is not valid YAML: found undefined alias " + e.value()));
                }
                if (!(target instanceof YScalar)) {
                    aliased += size(target, YamlDocument.MAX_ALIASED_VALUES + 1);
                    if (aliased > YamlDocument.MAX_ALIASED_VALUES) {
                        throw new InvalidInputException(Problem.at(source, e.line(), e.column(), "", "aliases (*name) in this "
                                + "document repeat more than " + YamlDocument.MAX_ALIASED_VALUES
                                + " values; write the values out or use fewer aliases"));
                    }
                }
                return target;
            }
            default:
                throw new IllegalStateException("unexpected " + e.type() + " at " + e.line() + ":" + e.column());
        }
    }

    /** A mapping or list begins: one level deeper, and its anchor open until it ends. */
    private void enter(NodeEvent start) {
        if (++depth > YamlDocument.MAX_DEPTH) {
            throw new InvalidInputException(Problem.at(source, start.line(), start.column(), "",
                    "mappings and lists nest more than " + YamlDocument.MAX_DEPTH + " deep here; tend files are far flatter"));
        }
        if (start.anchor() != null) open.put(start.anchor(), start);
    }

    private <T extends YNode> T remember(NodeEvent start, T node) {
        if (!(node instanceof YScalar)) depth--;
        if (start.anchor() != null) {
            open.remove(start.anchor());
            anchors.put(start.anchor(), node);
        }
        return node;
    }

    /** The values in {@code node} (itself included), counted up to {@code limit}. */
    private static int size(YNode node, int limit) {
        int n = 1;
        if (node instanceof YMap m) {
            for (YMap.Entry e : m.entries()) {
                if (n >= limit) break;
                n += size(e.value(), limit - n);
            }
        } else if (node instanceof YList l) {
            for (YNode i : l.items()) {
                if (n >= limit) break;
                n += size(i, limit - n);
            }
        }
        return n;
    }
}
