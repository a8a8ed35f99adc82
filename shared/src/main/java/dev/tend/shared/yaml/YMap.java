package dev.tend.shared.yaml;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/** A mapping with scalar keys, in document order. Entries are unmodifiable. */
public record YMap(List<Entry> entries, int line, int column) implements YNode {
    public record Entry(YScalar key, YNode value) {
    }

    public YMap {
        entries = List.copyOf(entries);
    }

    /** The value under {@code key}, if present. */
    public Optional<YNode> get(String key) {
        for (Entry e : entries) {
            if (e.key().value().equals(key)) return Optional.of(e.value());
        }
        return Optional.empty();
    }

    public boolean has(String key) {
        return get(key).isPresent();
    }

    public List<String> keys() {
        List<String> keys = new ArrayList<>();
        for (Entry e : entries) keys.add(e.key().value());
        return keys;
    }

    @Override
    public String kind() {
        return "a mapping";
    }
}
