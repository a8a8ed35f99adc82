package dev.tend.store.internal;

import java.util.Map;

/** What differs between the two databases the store runs on; everything else is shared SQL. */
public enum Dialect {
    // a table keyed by text, kept as its key's b-tree alone (one page per small write, not two)
    SQLITE(Map.of("seq_key", "INTEGER", "blob_type", "BLOB", "without_rowid", "WITHOUT ROWID")),
    POSTGRESQL(Map.of("seq_key", "BIGINT", "blob_type", "BYTEA", "without_rowid", ""));

    private final Map<String, String> placeholders;

    Dialect(Map<String, String> placeholders) {
        this.placeholders = placeholders;
    }

    /** Values for the ${...} placeholders in the migration scripts. */
    public Map<String, String> placeholders() {
        return placeholders;
    }
}
