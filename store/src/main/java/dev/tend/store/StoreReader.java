package dev.tend.store;

import dev.tend.shared.ApprovalState;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.function.Consumer;

/**
 * Read access to the store, valid only inside the callback it was handed to (using it
 * afterwards throws {@link StoreException}) and only on that callback's thread. The reads
 * of one {@link Store#read} callback see one consistent snapshot. Inside a transaction they
 * also see that transaction's own writes (on PostgreSQL, at READ COMMITTED, each statement
 * also sees what other transactions committed before it). Lists are unmodifiable;
 * failures throw {@link StoreException}.
 */
public interface StoreReader {
    /**
     * Streams the input journal in seq order, starting after {@code afterSeq} (0 for all).
     * Rows are read as the consumer takes them, never all at once, so this handles a
     * journal of millions. The consumer must not append inputs through this transaction.
     */
    void forEachInput(long afterSeq, Consumer<InputRow> consumer);

    /** The seq of the last input in the journal; 0 when it is empty. */
    long lastInputSeq();

    /** Runs that pass {@code filter}, newest ({@code createdAt}) first. */
    List<RunRow> runs(RunFilter filter);

    Optional<RunRow> run(String runId);

    /** The run's steps by ordinal; empty when the run has none or does not exist. */
    List<StepRow> steps(String runId);

    /** Every armed timer, soonest first (ties by key). */
    List<TimerRow> timers();

    /**
     * Every exclusion, by cluster, whole-cluster ones before node ones, then by node.
     * Lapsed ones ({@code until} in the past) are included: the store does not know the time.
     */
    List<ExclusionRow> exclusions();

    /**
     * Approvals in {@code stateOrNull} , or all when null,
     * oldest request first.
     */
    List<ApprovalRow> approvals(ApprovalState stateOrNull);

    /** The JSON text put under {@code key}, if any. */
    Optional<String> state(String key);

    /** Streams the ledger entries that pass {@code filter} in seq order. */
    void forEachLedger(LedgerFilter filter, Consumer<LedgerEntry> consumer);

    /**
     * The newest {@code limit} entries that pass {@code filter} and whose seq is below
     * {@code beforeSeq} ({@link Long#MAX_VALUE} for no bound), newest first. The store walks an
     * index from the newest entry backwards and stops at the limit, so a page costs about the
     * same on a ledger of millions as on a small one (the next page: {@code beforeSeq} = the
     * last seq of this one).
     */
    List<LedgerEntry> newestLedger(LedgerFilter filter, long beforeSeq, int limit);

    /**
     * Streams, in seq order, what a report of a period needs of the ledger (see
     * {@link LedgerPeriodQuery}): every entry of the period and the few before it that carry
     * state into it, instead of the whole ledger before the period's end.
     */
    void forEachLedgerOfPeriod(LedgerPeriodQuery query, Consumer<LedgerEntry> consumer);

    /**
     * {@link #verifyLedgerFrom} and {@link #forEachLedgerOfPeriod} in one walk: verifies the
     * entries from {@code fromSeq} to the newest and, as it goes, hands what {@code query} asks
     * for to {@code consumer} in seq order, each entry with its text parsed, so that the period's entries are read and parsed once.
     * Every entry is handed on even after one fails verify. Pass the seq of the period's first
     * entry ({@link #firstLedgerSeqAt} of its start) or less.
     */
    LedgerVerification verifyLedgerFromReading(long fromSeq, LedgerPeriodQuery query, LedgerEntryRead consumer);

    /** The lowest seq of an entry at or after {@code at}; 0 when there is none. */
    long firstLedgerSeqAt(Instant at);

    /**
     * Like {@link #verifyLedger()} for the entries from {@code fromSeq} to the newest: each
     * entry's text, hash, chain link and columns, and the head row. The entry before
     * {@code fromSeq} must match its own text (its hash is where the checked chain hangs), but
     * the entries before it are not read. {@link LedgerVerification#entries()} counts the
     * entries checked. {@code fromSeq} 1 (or less) is the whole ledger.
     */
    LedgerVerification verifyLedgerFrom(long fromSeq);

    /** The distinct kinds of the ledger's entries, sorted. */
    java.util.SortedSet<String> ledgerKinds();

    /** The last ledger entry; empty when the ledger is empty. */
    Optional<LedgerEntry> ledgerHead();

    /**
     * Walks the whole ledger in seq order and checks every entry's text, hash and chain
     * link, its indexed columns and the head row. It finds an entry edited, dropped or
     * moved after it was written, except a removal of the newest entries together with a
     * matching rewrite of the head row: compare {@link LedgerVerification#headHash()}
     * with a copy kept elsewhere to rule that out.
     */
    LedgerVerification verifyLedger();

    /**
     * Streams the inputs of kind {@value InputRow#TRANSITION} and {@value InputRow#TOPOLOGY}
     * whose {@code eventAt} is at or after {@code from} and before {@code until}, on the
     * given clusters (an empty set means every cluster), in journal (seq) order: the order
     * the engine took them, late arrivals included. For exporting recordings.
     */
    void forEachTransitionInput(Instant from, Instant until, Set<String> clusters, Consumer<InputRow> consumer);

    /**
     * For each partition of {@code topic} taken in so far, the offset of its first record not
     * yet journaled or refused (see {@link StoreTx#putStreamOffset}); empty for a new topic.
     */
    java.util.Map<Integer, Long> streamOffsets(String topic);

    /** The newest snapshot (highest seq), if any. */
    Optional<SnapshotRow> latestSnapshot();

    /** The seq of the first input the journal still holds; 0 when it is empty (rows before it were archived). */
    long firstInputSeq();

    /** Pending pages due at {@code now} or before, soonest first, at most {@code limit}. */
    List<PageRow> pagesDue(Instant now, int limit);

    /** Pages in one of {@code states} (each from {@link PageRow#STATES}), newest first, at most {@code limit}. */
    List<PageRow> pages(Set<String> states, int limit);

    Optional<PageRow> page(String id);
}
