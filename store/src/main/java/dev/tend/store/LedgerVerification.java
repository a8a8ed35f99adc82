package dev.tend.store;

import java.util.Objects;

/**
 * What {@link StoreReader#verifyLedger()} found.
 *
 * @param ok             true when every entry verifies and the head row agrees
 * @param entries        how many entries were read
 * @param headHash       the hash of the last entry read (64 zeros for an empty ledger)
 * @param firstBrokenSeq the first entry that does not verify (a missing entry's seq when
 *                       one was dropped); 0 when {@code ok}
 * @param reason         a sentence: what was found, naming the entry; when {@code ok}, a
 *                       summary. Never null
 */
public record LedgerVerification(boolean ok, long entries, String headHash, long firstBrokenSeq, String reason) {
    public LedgerVerification {
        if (entries < 0) throw new IllegalArgumentException("LedgerVerification.entries must be 0 or more, got " + entries);
        Objects.requireNonNull(headHash, "LedgerVerification.headHash must not be null");
        Objects.requireNonNull(reason, "LedgerVerification.reason must not be null");
        if (ok && firstBrokenSeq != 0) {
            throw new IllegalArgumentException("LedgerVerification.firstBrokenSeq must be 0 when ok, got " + firstBrokenSeq);
        }
        if (!ok && firstBrokenSeq < 1) {
            throw new IllegalArgumentException("LedgerVerification.firstBrokenSeq must name an entry (1 or more) when not ok, got " + firstBrokenSeq);
        }
    }

    /** This result, or a {@link LedgerBrokenException} carrying it when not {@code ok}. */
    public LedgerVerification orThrow(String location) {
        if (!ok) throw new LedgerBrokenException(location, firstBrokenSeq, reason);
        return this;
    }
}
