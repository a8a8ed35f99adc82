package dev.tend.playbooks;

import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Selects clusters by their tags: for every tag named, the cluster's value must be one of
 * the allowed values. A cluster without the tag does not match. The empty selector
 * matches every cluster. Immutable; keys and values are kept sorted, so equal selectors
 * print the same.
 */
public final class TagSelector {
    private static final TagSelector ALL = new TagSelector(Map.of());

    private final Map<String, Set<String>> allowed;

    /** {@link #allowed} as two arrays, for {@link #matches} (asked for every problem a fleet reports): no iterator. */
    private final String[] tags;
    private final Set<?>[] values;

    private TagSelector(Map<String, Set<String>> allowed) {
        this.allowed = allowed;
        this.tags = allowed.keySet().toArray(new String[0]);
        this.values = new Set<?>[tags.length];
        for (int i = 0; i < tags.length; i++) values[i] = allowed.get(tags[i]);
    }

    /** The selector that matches every cluster. */
    public static TagSelector all() {
        return ALL;
    }

    /**
     * A selector from tag name to allowed values. Throws {@link IllegalArgumentException}
     * when a tag name is blank or a tag allows no value (it could match nothing).
     */
    public static TagSelector of(Map<String, ? extends Iterable<String>> allowed) {
        Map<String, Set<String>> copy = new TreeMap<>();
        for (Map.Entry<String, ? extends Iterable<String>> e : allowed.entrySet()) {
            String tag = Objects.requireNonNull(e.getKey(), "tag name");
            if (tag.isBlank()) throw new IllegalArgumentException("a tag name in a cluster selector must not be blank");
            Set<String> values = new TreeSet<>();
            for (String v : e.getValue()) values.add(Objects.requireNonNull(v, "tag value"));
            if (values.isEmpty()) {
                throw new IllegalArgumentException("tag '" + tag + "' lists no allowed value, so the selector could match no cluster");
            }
            copy.put(tag, Collections.unmodifiableSet(values));
        }
        return copy.isEmpty() ? ALL : new TagSelector(Collections.unmodifiableMap(copy));
    }

    /** A selector requiring {@code tag} to be one of {@code values}. */
    public static TagSelector of(String tag, String... values) {
        return of(Map.of(tag, List.of(values)));
    }

    /** Tag name to allowed values, sorted, unmodifiable. */
    public Map<String, Set<String>> allowed() {
        return allowed;
    }

    public boolean isAll() {
        return allowed.isEmpty();
    }

    /** True when {@code tags} (a cluster's tags) has an allowed value for every tag named. */
    public boolean matches(Map<String, String> tags) {
        for (int i = 0; i < this.tags.length; i++) {
            String v = tags.get(this.tags[i]);
            if (v == null || !values[i].contains(v)) return false;
        }
        return true;
    }

    /**
     * True when some set of tags satisfies both selectors: every tag named by both allows
     * at least one common value.
     */
    public boolean overlaps(TagSelector other) {
        for (Map.Entry<String, Set<String>> e : allowed.entrySet()) {
            Set<String> theirs = other.allowed.get(e.getKey());
            if (theirs == null) continue;
            Set<String> common = new LinkedHashSet<>(e.getValue());
            common.retainAll(theirs);
            if (common.isEmpty()) return false;
        }
        return true;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof TagSelector t && t.allowed.equals(allowed);
    }

    @Override
    public int hashCode() {
        return allowed.hashCode();
    }

    /** The selector as written in YAML flow style, e.g. {@code {team: [payments], tier: [critical, standard]}}. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("{");
        for (Map.Entry<String, Set<String>> e : allowed.entrySet()) {
            if (sb.length() > 1) sb.append(", ");
            sb.append(e.getKey()).append(": [").append(String.join(", ", e.getValue())).append(']');
        }
        return sb.append('}').toString();
    }
}
