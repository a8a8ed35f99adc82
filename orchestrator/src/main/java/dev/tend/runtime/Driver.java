package dev.tend.runtime;

import dev.tend.audit.CheckpointWriter;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.Input;
import dev.tend.shared.TendException;
import dev.tend.store.InputRow;
import dev.tend.store.Store;

import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.function.BooleanSupplier;

/**
 * The {@link Orchestrator}'s driver loop: takes inputs in order, lets the engine decide a
 * batch, commits the journal rows, ledger entries and projections of the batch in one
 * transaction ({@link CommitWriter}), and only after that commit performs the batch's side
 * effects. Batches are decided on the driver thread while the batches before are committed
 * on the {@link CommitPipeline}; an input that cannot be decided or kept takes its batch apart.
 */
final class Driver {
    /**
     * The most inputs a batch holds. Every commit rewrites the index pages its rows touch, and
     * the ledger's index by cluster takes its entries at as many places as there are clusters:
     * with 10,000 inputs a batch instead of 2,000 a page takes several entries per commit, and a
     * file's ingest used a tenth less of the committing thread (DEVELOPERS.md, "Ingest"). A live
     * server's batches are what waits, far fewer.
     */
    static final int BATCH = 10_000;
    /**
     * The smallest batch committed on the {@link CommitThread}: a smaller one (the live path's
     * few requests at a time) is committed on the driver thread, where handing it over and
     * waking the driver again would cost more than deciding the next batch meanwhile saves.
     */
    private static final int PIPELINE_FROM = 64;
    /** A batch reads the clock every this many inputs, which share the instant (DEVELOPERS.md, "Ingest"). */
    static final int CLOCK_EVERY = 64;
    /** How long the idle driver sleeps before it looks at {@code done} and the checkpoints again; any input wakes it ({@link Inbox}). */
    private static final long IDLE_NANOS = 20_000_000;

    private final Store store;
    private final SnapshotPolicy snapshotPolicy;
    /** Replaced at {@link #loadState} and when a batch is taken apart ({@link #retryOneByOne}); read via {@link #engine()}. */
    private volatile Engine engine;
    private final SnapshotKeeper snapshots;
    private long sinceSnapshot;
    private final Clock clock;
    private final CommitListener listener;
    private final Inbox inbox;
    private final EffectRunner effects;
    private final Waiters waiters;
    private volatile boolean stopping;
    /** The input the events queue is fed from (see {@link #readFrom}); null when it has no identity. */
    private volatile String source;
    /** Events of {@link #source} journaled (or refused) so far, from the journal's progress rows on. */
    private long sourceDone;
    /** Keyed checkpoints of the ledger (DESIGN.md section 6); null without a ledger key. */
    private volatile CheckpointWriter checkpoints;
    private final CommitWriter writer;
    private final CommitPipeline pipeline = new CommitPipeline(); // the batches committed while the next is decided
    private int batchLimit = BATCH; // or fewer for a test that needs several batches of a few inputs

    Driver(Store store, EngineSetup setup, Clock clock, CommitListener listener, SnapshotPolicy snapshotPolicy,
           Inbox inbox, EffectRunner effects, Waiters waiters) {
        this.store = store;
        this.snapshotPolicy = java.util.Objects.requireNonNull(snapshotPolicy, "snapshotPolicy");
        this.engine = new Engine(setup);
        this.snapshots = new SnapshotKeeper(store, setup);
        this.clock = clock;
        this.listener = java.util.Objects.requireNonNull(listener, "listener");
        this.inbox = inbox;
        this.effects = effects;
        this.waiters = waiters;
        this.writer = new CommitWriter(store, waiters);
    }

    Engine engine() {
        return engine;
    }

    SnapshotKeeper snapshots() {
        return snapshots;
    }

    /** {@link #loadState} at a start: the inputs replayed count towards the next snapshot. */
    long[] start() {
        long[] loaded = loadState();
        sinceSnapshot = loaded[1];
        return loaded;
    }

    /**
     * Builds the engine from the newest snapshot and the journal after it, or from the whole
     * journal (when there is no snapshot, or it was taken under another policy or fleet and
     * the whole journal is still there to replay under this one). Journaled inputs are fed
     * to the engine with their effects discarded (they are already in the store). Returns
     * the snapshot's seq (0: none used) and how many inputs were replayed.
     */
    long[] loadState() {
        JournalTail tail = snapshots.tail();
        long before = tail.replayed();
        tail.catchUp();
        snapshots.caughtUp(tail);
        engine = tail.engine();
        return new long[]{tail.snapshotSeq(), tail.replayed() - before};
    }

    /** See {@link Orchestrator#readingFrom}. */
    long readFrom(String sourceIdentity) {
        this.source = java.util.Objects.requireNonNull(sourceIdentity, "sourceIdentity");
        sourceDone = snapshots.progressOf(sourceIdentity);
        return sourceDone;
    }

    void checkpointWith(CheckpointWriter w) {
        this.checkpoints = w;
    }

    /** Batches of at most {@code limit} inputs from now on (tests). */
    void limitBatches(int limit) {
        if (limit < 1 || limit > BATCH) throw new IllegalArgumentException("a batch holds 1 to " + BATCH + " inputs, not " + limit);
        batchLimit = limit;
    }

    void stop() {
        stopping = true;
        inbox.wake();
    }

    /** Processes inputs on the calling thread until {@code done} holds with nothing queued, or {@link #stop()}. */
    void run(BooleanSupplier done) throws InterruptedException {
        boolean failed = true;
        try {
            loop(done);
            settle(0, List.of()); // stopped with batches in flight: they are committed and acted on first
            writer.closeReceiptsIfDue(null); // and the receipts still open are appended to the ledger
            failed = false;
            // a clean stop: the next start loads this state and replays nothing; the store's log is copied meanwhile
            store.copyLogSoon();
            if (snapshotPolicy.isEnabled() && sinceSnapshot > 0) writeSnapshot();
            snapshots.collect(true);
        } finally {
            pipeline.abandon(waiters); // the driver failed with batches in flight: their callers are told
            // what is still queued will not be taken by this driver: its callers stop waiting now
            if (stopping || failed) waiters.failAll(new TendException("tend stopped before journaling this input; it was not applied"));
            pipeline.close();
            CheckpointWriter w = checkpoints;
            if (w != null && !failed) w.write(clock.instant()); // at every stop that leaves the store whole
        }
    }

    /**
     * Writes the engine's state, with the progress of the inputs read from files, as the
     * snapshot after the newest journal row (everything decided is committed: the driver calls
     * it between batches with none in flight).
     */
    private void writeSnapshot() {
        if (snapshots.write(engine, source, sourceDone, clock.instant())) sinceSnapshot = 0;
    }

    /**
     * Group commit that waits on work, not on timers: a batch is whatever waits when the
     * driver looks (up to {@link #BATCH}). An input arriving at an idle driver is decided and
     * committed at once, on the driver thread. When more is waiting, the batch is committed on
     * the {@link CommitPipeline} while the driver decides the next ones (on the engine's state
     * after them); the driver waits for a commit and only then performs its batch's effects,
     * so side effects follow their commit, in batch order, with {@link CommitPipeline#DEPTH}
     * batches in flight at most.
     */
    private void loop(BooleanSupplier done) throws InterruptedException {
        while (!stopping) {
            List<Input> batch = new ArrayList<>(Math.min(batchLimit, 2048));
            java.util.BitSet queued = new java.util.BitSet();
            inbox.drainTo(batch, queued, batchLimit);
            if (batch.isEmpty()) {
                if (!pipeline.isEmpty()) {
                    settle(0, List.of()); // nothing more to decide: act on the batches being committed
                    continue;
                }
                if (done.getAsBoolean() && inbox.isEmpty()) return;
                CheckpointWriter w = checkpoints;
                if (w != null) w.maybeWrite(clock.instant());
                writer.closeReceiptsIfDue(clock.instant()); // a second after the last request, its receipt is in the ledger
                inbox.awaitInput(IDLE_NANOS);
                if (Thread.interrupted()) throw new InterruptedException("the driver was interrupted");
                continue;
            }
            process(batch, queued);
            CheckpointWriter w = checkpoints;
            if (w != null) w.maybeWrite(clock.instant());
        }
    }

    private void process(List<Input> batch, java.util.BitSet queued) {
        DecidedBatch next;
        try {
            next = decide(batch, queued);
        } catch (RuntimeException e) {
            // what one input carries cannot be decided: nothing of the batch was written or done
            takeApart(batch, queued);
            return;
        }
        // a small batch, or nothing else waits: an idle driver commits at once
        boolean now = next.size() < PIPELINE_FROM || inbox.isEmpty();
        if (!now && !pipeline.carriesSnapshot()
                && snapshotPolicy.isDue(sinceSnapshot + pipeline.inputs() + next.size(), engine.health().signalCount())) {
            // the state after it is the next snapshot, written once it is committed (finish): nothing waits for that
            next = next.withStateAfter(engine.state());
        }
        // committed here, every batch before it must be; handed over, one must make room
        if (!settle(now ? 0 : CommitPipeline.DEPTH - 1, next.inputs())) {
            // a batch in flight failed and was redone input by input; next was decided on what never became durable
            retryOneByOne(next.inputs(), next.queued());
        } else if (now) {
            try {
                commit(next);
            } catch (RuntimeException e) {
                redo(next, e, List.of());
                return;
            }
            finish(next);
        } else {
            pipeline.start(next, this::commit);
        }
        if (pipeline.isEmpty() && snapshotPolicy.isDue(sinceSnapshot, engine.health().signalCount())) writeSnapshot();
    }

    /** Lets the engine decide {@code batch} after the batches in flight, if any; writes and performs nothing. */
    private DecidedBatch decide(List<Input> batch, java.util.BitSet queued) {
        List<Effect> all = new ArrayList<>();
        List<Instant> times = new ArrayList<>(batch.size());
        List<List<Effect>> perInput = new ArrayList<>(batch.size());
        List<Projections.Prepared> prepared = new ArrayList<>(batch.size());
        Instant now = null;
        for (int i = 0; i < batch.size(); i++) {
            Input in = batch.get(i);
            if (i % CLOCK_EVERY == 0) now = clock.instant();
            List<Effect> fx = engine.handle(in, now);
            all.addAll(fx);
            times.add(now);
            perInput.add(fx);
            prepared.add(Projections.Prepared.of(now, fx));
            if (in instanceof Input.ExecutorResult r && !r.clears().isEmpty()) SimulatedClears.queueBehind(engine, r, batch);
        }
        Projections.Prepared.renderFor(prepared, waiters.hasReceipts());
        long before = pipeline.sourceAfter(sourceDone);
        long after = before + queued.cardinality();
        InputRow progress = source != null && after > before ? SourceProgress.row(source, after, times.get(times.size() - 1)) : null;
        return new DecidedBatch(batch, queued, progress, times, perInput, prepared, all, after, waiters.reached(batch));
    }

    /**
     * Writes {@code b} (on the committing thread when the driver goes on deciding): its journal
     * rows are encoded here, off the driver thread; an input that cannot be encoded fails the
     * commit, and the batch is taken apart as for any input the store cannot hold.
     */
    private void commit(DecidedBatch b) {
        List<InputRow> rows = new ArrayList<>(b.size() + 1);
        for (int i = 0; i < b.size(); i++) rows.add(InputCodec.encode(b.inputs().get(i), b.times().get(i)));
        if (b.progress() != null) rows.add(b.progress());
        b.journaledThrough().set(writer.batch(b, rows));
    }

    /** Acts on a committed batch: its side effects, the listener, its waiting callers. */
    private void finish(DecidedBatch b) {
        sourceDone = b.sourceAfter();
        sinceSnapshot += b.size();
        effects.performAll(b.all(), b.replacedTimers());
        if (b.stateAfter() != null && snapshots.write(b.stateAfter(), b.journaledThrough().get(), source, sourceDone, clock.instant())) {
            sinceSnapshot = 0;
        }
        snapshots.collect(false);
        listener.committed(engine, java.util.Collections.unmodifiableList(b.inputs()), java.util.Collections.unmodifiableList(b.all()));
        waiters.committed(b.inputs(), b.perInput());
    }

    /**
     * Waits for the oldest batches in flight to be committed, until {@code keep} remain, and
     * acts on each; true when they were. When a commit failed, that batch and the ones after
     * it (decided on its state, and not written) are redone input by input on an engine
     * rebuilt from the journal, and false says that {@code decidedAfter} must be redone too.
     */
    private boolean settle(int keep, List<Input> decidedAfter) {
        while (pipeline.size() > keep) {
            CommitPipeline.Settled s = pipeline.takeOldest();
            if (s.failure() != null) {
                redoFrom(s, pipeline.takeAll(), decidedAfter);
                return false;
            }
            finish(s.batch());
        }
        return true;
    }

    /** {@code failed}'s commit failed: it and {@code later} are redone (see {@link #redo}). */
    private void redoFrom(CommitPipeline.Settled failed, List<CommitPipeline.Settled> later, List<Input> decidedAfter) {
        List<Input> after = new ArrayList<>();
        for (CommitPipeline.Settled s : later) after.addAll(s.batch().inputs());
        after.addAll(decidedAfter);
        redo(failed.batch(), failed.failure(), after);
        for (CommitPipeline.Settled s : later) retryOneByOne(s.batch().inputs(), s.batch().queued());
    }

    /**
     * After {@code batch} could not be decided, part-way: the batches in flight are settled on
     * an engine rebuilt from the journal (their listener must not see the part-way state), then
     * {@code batch} is taken apart.
     */
    private void takeApart(List<Input> batch, java.util.BitSet queued) {
        List<CommitPipeline.Settled> before = pipeline.takeAll();
        if (!before.isEmpty()) rebuild();
        for (int i = 0; i < before.size(); i++) {
            CommitPipeline.Settled s = before.get(i);
            if (s.failure() != null) {
                redoFrom(s, before.subList(i + 1, before.size()), batch);
                break;
            }
            finish(s.batch());
        }
        retryOneByOne(batch, queued);
    }

    /**
     * The commit of {@code b} failed ({@code e}): nothing of it was written or done. A failure
     * of the database stops tend (the callers of {@code b} and of {@code decidedAfter} are
     * told); else {@code b} is taken apart.
     */
    private void redo(DecidedBatch b, RuntimeException e, List<Input> decidedAfter) {
        if (InputRefusal.isDatabaseFailure(e)) {
            List<Input> all = new ArrayList<>(b.inputs());
            all.addAll(decidedAfter);
            stopOn(all, e);
        }
        retryOneByOne(b.inputs(), b.queued());
    }

    /**
     * Takes a batch apart after an input in it could not be decided or committed: the engine
     * is rebuilt from the journal (which holds exactly what was committed, so the rebuilt
     * engine is the one before the batch, and no effect of the batch has been performed),
     * then each input is decided and committed on its own. The input at fault is refused on
     * the record (a ledger entry naming it, and the listener is told) and the others go on.
     */
    private void retryOneByOne(List<Input> batch, java.util.BitSet queued) {
        rebuild();
        for (int i = 0; i < batch.size(); i++) {
            Input in = batch.get(i);
            Instant now = clock.instant();
            List<InputRow> rows = new ArrayList<>(2);
            if (source != null && queued.get(i)) rows.add(SourceProgress.row(source, sourceDone + 1, now));
            List<Effect> fx;
            try {
                rows.add(0, InputCodec.encode(in, now));
                fx = engine.handle(in, now);
                writer.one(in, rows, now, fx);
            } catch (RuntimeException e) {
                if (InputRefusal.isDatabaseFailure(e)) stopOn(batch.subList(i, batch.size()), e);
                rebuild();
                refuse(batch.subList(i, batch.size()), in, now, e, source != null && queued.get(i));
                continue;
            }
            if (source != null && queued.get(i)) sourceDone++;
            sinceSnapshot++;
            for (Effect e : fx) effects.perform(e);
            listener.committed(engine, List.of(in), java.util.Collections.unmodifiableList(fx));
            waiters.committed(in, fx);
        }
    }

    /** The engine of what the journal holds: the newest snapshot and the inputs after it. */
    private void rebuild() {
        loadState();
    }

    private void refuse(List<Input> rest, Input in, Instant now, RuntimeException cause, boolean ofSource) {
        String reason = InputRefusal.reason(cause);
        try {
            writer.refusal(in, now, reason, ofSource ? SourceProgress.row(source, sourceDone + 1, now) : null);
        } catch (RuntimeException e) {
            stopOn(rest, e);
        }
        if (ofSource) sourceDone++;
        listener.refused(in, reason);
        waiters.failed(in, InputRefusal.asInvalidInput(in, reason));
    }

    /** A failure of the database itself: tend stops safely and resumes from the journal when started again. */
    private void stopOn(List<Input> batch, RuntimeException e) {
        stopping = true;
        for (Input in : batch) waiters.failed(in, e);
        throw new TendException("could not commit " + batch.size() + " input(s) to " + store.location()
                + "; tend stops here and resumes from the journal when started again: " + e.getMessage(), e);
    }
}
