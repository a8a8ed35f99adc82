package dev.tend.store;

import dev.tend.shared.Id;
import dev.tend.shared.json.CanonicalJson;
import dev.tend.shared.time.InstantText;

import java.time.Instant;
import java.util.AbstractMap;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.function.BiConsumer;

/**
 * A ledger entry before it is appended: the store adds {@code seq}, {@code at} and
 * {@code kind} to {@code fields}, writes the RFC 8785 canonical JSON and chains its hash.
 *
 * <p>{@code fields} may hold JSON values (null, String, Boolean, finite Number, Map with
 * String keys, List) and, for convenience, {@link Instant} (written as RFC 3339 UTC text),
 * {@link Id} (written as its text) and enums (their {@code toString()}). It must not hold
 * the keys {@code seq}, {@code at} or {@code kind}. When present, {@code cluster},
 * {@code playbook} and {@code run} must be text: they are copied to indexed columns.
 * The map is copied (deeply) and the copy is unmodifiable; the fields of another draft are
 * taken as they are (they were checked and copied when that draft was made), so restamping a
 * draft ({@link #stampedAt(Instant)}) costs no copy.
 */
public record LedgerDraft(Instant at, String kind, Map<String, Object> fields) {
    /** Keys the store writes itself. */
    public static final Set<String> RESERVED = Set.of("seq", "at", "kind");
    /** Keys copied to indexed columns of the ledger. */
    public static final List<String> INDEXED = List.of("cluster", "playbook", "run");

    public LedgerDraft {
        Objects.requireNonNull(at, "LedgerDraft.at must not be null");
        Objects.requireNonNull(kind, "LedgerDraft.kind must not be null");
        if (kind.isBlank()) throw new IllegalArgumentException("LedgerDraft.kind must not be blank");
        Objects.requireNonNull(fields, "LedgerDraft.fields must not be null (pass an empty map)");
        if (!(fields instanceof Checked)) fields = new Checked(checkedCopy(fields));
    }

    /** This draft stamped {@code newAt}, sharing its checked fields. */
    public LedgerDraft stampedAt(Instant newAt) {
        return new LedgerDraft(newAt, kind, fields);
    }

    private static Map<String, Object> checkedCopy(Map<String, Object> fields) {
        Map<String, Object> copy = new LinkedHashMap<>();
        for (Map.Entry<?, ?> e : fields.entrySet()) {
            if (!(e.getKey() instanceof String key)) {
                throw new IllegalArgumentException("LedgerDraft.fields keys must be text, got " + e.getKey());
            }
            if (RESERVED.contains(key)) {
                throw new IllegalArgumentException("LedgerDraft.fields must not hold '" + key + "': the store writes seq, at and kind itself");
            }
            Object value = normalize(e.getValue(), "LedgerDraft.fields." + key);
            if (INDEXED.contains(key) && value != null && !(value instanceof String)) {
                throw new IllegalArgumentException("LedgerDraft.fields." + key + " must be text (it is indexed), got " + value);
            }
            copy.put(key, value);
        }
        return Collections.unmodifiableMap(copy);
    }

    public static LedgerDraft of(Instant at, String kind, Map<String, Object> fields) {
        return new LedgerDraft(at, kind, fields);
    }

    /**
     * Renders this draft's entry text now, on the calling thread, all but its seq: the driver
     * renders a batch's drafts while the batch before is written, so that the committing
     * thread only puts each seq in and hashes ({@link #textAt}). Returns this draft.
     */
    public LedgerDraft render() {
        ((Checked) fields).rendered = new Rendered(at, kind,
                CanonicalJson.serializeObjectAround(fields, "seq", "seq", 0L, "at", InstantText.of(at), "kind", kind));
        return this;
    }

    /**
     * The entry's text at {@code seq} (DESIGN.md section 6): the RFC 8785 canonical JSON of
     * the fields with {@code seq}, {@code at} (RFC 3339 UTC, fractional seconds only when not
     * zero) and {@code kind}; from {@link #render()}'s rendering when it is this draft's.
     */
    public String textAt(long seq) {
        Rendered r = ((Checked) fields).rendered;
        if (r != null && r.at().equals(at) && r.kind().equals(kind)) return r.parts()[0] + CanonicalJson.number(seq) + r.parts()[1];
        return CanonicalJson.serializeObject(fields, "seq", seq, "at", InstantText.of(at), "kind", kind);
    }

    /** A draft's text rendered for {@code at} and {@code kind}, split where its seq goes. */
    private record Rendered(Instant at, String kind, String[] parts) {
    }

    /** The text of an indexed field ({@code cluster}, {@code playbook}, {@code run}), or null. */
    public String indexed(String key) {
        return (String) fields.get(key);
    }

    /**
     * The fields of a draft, checked and copied by its constructor: only that constructor
     * makes one, so a map of this class needs no second look.
     */
    private static final class Checked extends AbstractMap<String, Object> {
        private final Map<String, Object> fields;
        /** The text {@link #render()} made; restamped drafts share it, and {@link #textAt} checks whose it is. */
        private volatile Rendered rendered;

        private Checked(Map<String, Object> fields) {
            this.fields = fields;
        }

        @Override
        public Set<Entry<String, Object>> entrySet() {
            return fields.entrySet();
        }

        @Override
        public Object get(Object key) {
            return fields.get(key);
        }

        @Override
        public boolean containsKey(Object key) {
            return fields.containsKey(key);
        }

        @Override
        public int size() {
            return fields.size();
        }

        @Override
        public Set<String> keySet() {
            return fields.keySet();
        }

        @Override
        public void forEach(BiConsumer<? super String, ? super Object> action) {
            fields.forEach(action);
        }
    }

    private static Object normalize(Object v, String path) {
        if (v == null || v instanceof String || v instanceof Boolean) return v;
        if (v instanceof Double d && !Double.isFinite(d) || v instanceof Float f && !Float.isFinite(f)) {
            throw new IllegalArgumentException(path + " must be a finite number (RFC 8785 has no form for " + v + ")");
        }
        if (v instanceof Number) return v;
        if (v instanceof Instant i) return InstantText.of(i);
        if (v instanceof Id id) return id.value();
        if (v instanceof Enum<?> e) return e.toString();
        if (v instanceof Map<?, ?> m) {
            Map<String, Object> copy = new LinkedHashMap<>();
            for (Map.Entry<?, ?> e : m.entrySet()) {
                if (!(e.getKey() instanceof String key)) {
                    throw new IllegalArgumentException(path + " keys must be text, got " + e.getKey());
                }
                copy.put(key, normalize(e.getValue(), path + "." + key));
            }
            return Collections.unmodifiableMap(copy);
        }
        if (v instanceof Iterable<?> it) {
            List<Object> copy = new ArrayList<>();
            int i = 0;
            for (Object o : it) copy.add(normalize(o, path + "[" + i++ + "]"));
            return Collections.unmodifiableList(copy);
        }
        throw new IllegalArgumentException(path + " is a " + v.getClass().getName()
                + ", which is not a JSON value; pass text, a number, a boolean, a map or a list");
    }
}
