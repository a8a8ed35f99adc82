package dev.tend.store.internal;

/**
 * The tails of the journal and the ledger that the next appends continue from.
 *
 * @param inputSeq    the last input seq
 * @param ledgerSeq   the last ledger seq
 * @param ledgerHash  the last ledger hash (64 zeros when the ledger is empty)
 * @param connection  on SQLite, the connection {@code dataVersion} was read on; else null
 * @param dataVersion on SQLite, PRAGMA data_version when these were read; it changes when
 *                    another connection commits
 */
public record Heads(long inputSeq, long ledgerSeq, String ledgerHash, Object connection, long dataVersion) {
    public Heads withInputSeq(long seq) {
        return new Heads(seq, ledgerSeq, ledgerHash, connection, dataVersion);
    }

    public Heads withLedger(long seq, String hash) {
        return new Heads(inputSeq, seq, hash, connection, dataVersion);
    }
}
