package dev.tend.store;

import java.time.Instant;
import java.util.List;
import java.util.Map;

/**
 * Write access inside one transaction, handed to {@link Store#inTransaction}. Everything
 * written through it commits together when the callback returns, or not at all when it
 * throws. Reads through it see its own writes. Valid only inside the callback and on its
 * thread.
 *
 * <p>Journal and ledger appends are sent to the database in batches (when the callback
 * returns, before the next read, or every few thousand rows), so a failing append (say, a
 * full disk) may surface at one of those points instead of at the call; either way the
 * whole transaction is rolled back.
 */
public interface StoreTx extends StoreReader {
    /** Appends one input (its seq must be 0) and returns the seq it was given. */
    long appendInput(InputRow row);

    /**
     * Appends inputs in list order (their seqs must be 0) and returns the seq given to the
     * last one ({@link #lastInputSeq()} when the list is empty). Seqs are consecutive.
     */
    long appendInputs(List<InputRow> rows);

    /** Appends one ledger entry; see {@link LedgerDraft} for what {@code fields} may hold. */
    LedgerEntry appendLedger(Instant at, String kind, Map<String, Object> fields);

    /** Appends ledger entries in list order. */
    List<LedgerEntry> appendLedger(List<LedgerDraft> drafts);

    /**
     * Appends ledger entries in list order, as {@link #appendLedger(List)}, their chain hashed
     * on {@code aside} while this thread runs {@code meanwhile} (the transaction's other writes,
     * which must append nothing to the ledger) and sends what it wrote to the database: a
     * batch of thousands of entries is hashed beside the writing of its journal rows.
     */
    default List<LedgerEntry> appendLedgerLinkedAside(List<LedgerDraft> drafts, java.util.concurrent.Executor aside, Runnable meanwhile) {
        meanwhile.run();
        return appendLedger(drafts);
    }

    /** Inserts the run, or replaces every column of the run with the same id. */
    void upsertRun(RunRow run);

    /** Inserts the step, or replaces the step with the same run id and step id. */
    void upsertStep(StepRow step);

    /** Arms the timer, replacing one with the same key. */
    void armTimer(TimerRow timer);

    /** Cancels the timer with this key; returns false when none was armed. */
    boolean cancelTimer(String key);

    /** Adds the exclusion, replacing one on the same cluster and node. */
    void upsertExclusion(ExclusionRow exclusion);

    /**
     * Removes the exclusion of {@code node} on {@code cluster} ({@code node} null: the
     * whole-cluster one); returns false when there was none.
     */
    boolean removeExclusion(String cluster, String node);

    /** Inserts the approval, or replaces the one of the same run. */
    void upsertApproval(ApprovalRow approval);

    /** Puts {@code json} under {@code key}, replacing what was there. */
    void putState(String key, String json);

    /** Deletes what is under {@code key}; returns false when there was nothing. */
    boolean deleteState(String key);

    /**
     * Keeps a snapshot, replacing one at the same seq, and deletes all but the newest
     * {@code keep} snapshots (at least 1).
     */
    void putSnapshot(SnapshotRow snapshot, int keep);

    /**
     * Deletes the journal rows with seq at most {@code throughSeq} taken before
     * {@code before}, except the newest row of the journal (whose seq the next append counts
     * from); returns how many were deleted. The ledger is not touched.
     */
    long deleteInputs(long throughSeq, Instant before);

    /**
     * Records that the records of {@code topic}'s partition {@code partition} before
     * {@code nextOffset} are taken in (journaled or refused), replacing what was recorded;
     * written in the transaction that journals them, so the two hold together.
     */
    void putStreamOffset(String topic, int partition, long nextOffset);

    /**
     * Adds each receipt's counts to the open receipt of its kind and caller, or opens one: the
     * counts are summed, {@code first} is the earliest and {@code last} the latest of the two.
     */
    void addToOpenReceipts(List<OpenReceipt> receipts);

    /**
     * Every open receipt, the oldest {@code first} first, removed from the store: the caller
     * appends them to the ledger in this transaction, so that none is lost or written twice.
     */
    List<OpenReceipt> takeOpenReceipts();

    /** Puts a page in the outbox, unless a page with its id is there already (then nothing changes). */
    void enqueuePage(PageRow page);

    /** Replaces the outbox row of the page with the same id (after a delivery attempt). */
    void updatePage(PageRow page);
}
