package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One entry of the audit ledger as written.
 *
 * @param seq      position in the ledger, from 1, without gaps
 * @param at       the time the entry is about (also in {@code entry} as "at")
 * @param kind     what sort of entry, e.g. verdict, run, step, approval (also in {@code entry})
 * @param cluster  the entry's "cluster" field; null when it has none
 * @param playbook the entry's "playbook" field; null when it has none
 * @param run      the entry's "run" field; null when it has none
 * @param entry    the entry: RFC 8785 canonical JSON text of its fields plus seq, at and kind
 * @param prevHash the hash of the entry before (64 zeros for the first)
 * @param hash     SHA-256 (hex) of {@code prevHash} followed by {@code entry}, UTF-8
 */
public record LedgerEntry(long seq, Instant at, String kind, String cluster, String playbook, String run,
                          String entry, String prevHash, String hash) {
    /** The prevHash of the first entry. */
    public static final String GENESIS_HASH = "0".repeat(64);

    public LedgerEntry {
        if (seq < 1) throw new IllegalArgumentException("LedgerEntry.seq must be 1 or more, got " + seq);
        Objects.requireNonNull(at, "LedgerEntry.at must not be null");
        Objects.requireNonNull(kind, "LedgerEntry.kind must not be null");
        Objects.requireNonNull(entry, "LedgerEntry.entry must not be null");
        requireHash(prevHash, "LedgerEntry.prevHash");
        requireHash(hash, "LedgerEntry.hash");
    }

    /** 64 lowercase hex digits; a loop, not a regex: entries are made at journal speed. */
    private static boolean isHex64(String h) {
        if (h.length() != 64) return false;
        for (int i = 0; i < 64; i++) {
            char c = h.charAt(i);
            if (!(c >= '0' && c <= '9' || c >= 'a' && c <= 'f')) return false;
        }
        return true;
    }

    private static void requireHash(String h, String field) {
        Objects.requireNonNull(h, field + " must not be null");
        if (!isHex64(h)) {
            throw new IllegalArgumentException(field + " must be 64 lowercase hex digits, got '" + h + "'");
        }
    }
}
