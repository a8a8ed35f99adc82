package dev.tend.handover;

import java.util.Objects;
import java.util.regex.Pattern;

/**
 * The ledger a report was computed from, and whether its hash chain verified when the report
 * was made, from the period's first entry to the newest (on a ledger of millions of entries a
 * report must not read them all; {@code tend audit verify} checks the whole chain).
 *
 * @param entries         entries in the whole ledger
 * @param entriesInPeriod entries in the report's period
 * @param headHash        the hash of the last entry (64 hex digits; zeros for an empty ledger)
 * @param verified        true when every entry verified
 * @param firstBrokenSeq  the first entry that did not verify; 0 when {@code verified}
 * @param verifyMessage   what the verification found, a sentence; never null
 * @param unreadable      entries of the period that were not readable JSON and were left out
 *                        (only an edited ledger has any)
 * @param verifiedFrom    the first entry the verification read (1: the whole ledger; one past
 *                        the newest when no entry is at or after the period's start); the
 *                        entries before it were not checked by this report
 */
public record LedgerStatus(long entries, long entriesInPeriod, String headHash, boolean verified, long firstBrokenSeq,
                           String verifyMessage, long unreadable, long verifiedFrom) {
    private static final Pattern HEX64 = Pattern.compile("[0-9a-f]{64}");

    public LedgerStatus {
        if (entries < 0) throw new IllegalArgumentException("LedgerStatus.entries must be 0 or more, got " + entries);
        if (entriesInPeriod < 0) {
            throw new IllegalArgumentException("LedgerStatus.entriesInPeriod must be 0 or more, got " + entriesInPeriod);
        }
        Objects.requireNonNull(headHash, "LedgerStatus.headHash must not be null");
        if (!HEX64.matcher(headHash).matches()) {
            throw new IllegalArgumentException("LedgerStatus.headHash must be 64 lowercase hex digits, got '" + headHash + "'");
        }
        if (verified != (firstBrokenSeq == 0)) {
            throw new IllegalArgumentException("LedgerStatus.firstBrokenSeq must be 0 exactly when verified, got " + firstBrokenSeq
                    + " with verified " + verified);
        }
        if (firstBrokenSeq < 0) {
            throw new IllegalArgumentException("LedgerStatus.firstBrokenSeq must be 0 or more, got " + firstBrokenSeq);
        }
        Objects.requireNonNull(verifyMessage, "LedgerStatus.verifyMessage must not be null");
        if (unreadable < 0) throw new IllegalArgumentException("LedgerStatus.unreadable must be 0 or more, got " + unreadable);
        if (verifiedFrom < 1) throw new IllegalArgumentException("LedgerStatus.verifiedFrom must be 1 or more, got " + verifiedFrom);
    }

    /** The status of a report that verified the whole ledger. */
    public LedgerStatus(long entries, long entriesInPeriod, String headHash, boolean verified, long firstBrokenSeq,
                        String verifyMessage, long unreadable) {
        this(entries, entriesInPeriod, headHash, verified, firstBrokenSeq, verifyMessage, unreadable, 1);
    }

    /** True when every entry of the ledger was verified, not only the period's and later ones. */
    public boolean verifiedWhole() {
        return verifiedFrom == 1;
    }
}
