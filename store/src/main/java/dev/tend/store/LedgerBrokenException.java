package dev.tend.store;

/**
 * The audit ledger failed verification: an entry was edited, dropped or moved after it was
 * written. {@link #firstBrokenSeq()} is the first entry that does not verify and the
 * message is the {@link LedgerVerification#reason()}.
 */
public class LedgerBrokenException extends StoreException {
    private final long firstBrokenSeq;

    public LedgerBrokenException(String location, long firstBrokenSeq, String reason) {
        super(location, reason);
        this.firstBrokenSeq = firstBrokenSeq;
    }

    public long firstBrokenSeq() {
        return firstBrokenSeq;
    }
}
