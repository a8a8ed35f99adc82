package dev.tend.runtime;

import dev.tend.audit.CheckpointWriter;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.executor.Executor;
import dev.tend.engine.Input;
import dev.tend.shared.Id;
import dev.tend.shared.TendException;
import dev.tend.shared.time.Timers;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;

import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.function.BooleanSupplier;

/**
 * The live driver around the engine. One thread takes inputs in order, journals each one,
 * lets the engine decide, and commits the journal rows, ledger entries and projections of
 * a batch in one transaction; only after the commit does it perform side effects (executor
 * calls, timers, notifications). A crash at any moment therefore loses nothing that was
 * acted on, and {@link #recover()} rebuilds the engine by replaying the journal.
 */
public final class Orchestrator {
    private static final int BATCH = 2000;
    /**
     * How long the idle driver sleeps before it looks at {@code done} and the checkpoints
     * again; any input wakes it at once (see {@link Inbox}).
     */
    private static final long IDLE_NANOS = 20_000_000;

    /** Inputs between two snapshots unless told otherwise (a snapshot writes the whole state; see DEVELOPERS.md). */
    public static final int DEFAULT_SNAPSHOT_EVERY = 50_000;

    private final Store store;
    private final int snapshotEvery;
    /**
     * Replaced at {@link #recover} and by a rebuilt one when a batch must be taken apart (see
     * {@link #retryOneByOne}); read by other threads only through {@link #engine()}.
     */
    private volatile Engine engine;
    private final SnapshotKeeper snapshots;
    private long sinceSnapshot;
    private final Clock clock;
    private final CommitListener listener;
    private final Inbox inbox = new Inbox();
    private final EffectRunner effects;
    private volatile boolean stopping;
    /** The input the events queue is fed from (see {@link #readingFrom}); null when it has no identity. */
    private volatile String source;
    /** Events of {@link #source} journaled (or refused) so far, from the journal's progress rows on. */
    private long sourceDone;
    /** Keyed checkpoints of the ledger (DESIGN.md section 6); null without a ledger key. */
    private volatile CheckpointWriter checkpoints;
    /** Callers waiting for their input's commit, and receipts to append with an input (see {@link #submitEventAndWait(Input, LedgerDraft)}). */
    private final Waiters waiters = new Waiters();
    private final CommitWriter writer;

    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock) {
        this(store, setup, executors, timers, notifier, clock, CommitListener.NONE);
    }

    /** As above, with a listener told about every committed batch on the driver thread. */
    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock, CommitListener listener) {
        this(store, setup, executors, timers, notifier, clock, listener, DEFAULT_SNAPSHOT_EVERY);
    }

    /**
     * As above, writing a snapshot of the engine every {@code snapshotEvery} inputs and at a
     * clean stop ({@code 0}: never).
     */
    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock, CommitListener listener, int snapshotEvery) {
        if (snapshotEvery < 0) throw new IllegalArgumentException("snapshotEvery must be 0 (never) or more, got " + snapshotEvery);
        this.listener = java.util.Objects.requireNonNull(listener, "listener");
        this.store = store;
        this.snapshotEvery = snapshotEvery;
        this.engine = new Engine(setup);
        this.snapshots = new SnapshotKeeper(store, setup);
        this.effects = new EffectRunner(executors, timers, notifier, inbox);
        this.clock = clock;
        this.writer = new CommitWriter(store, waiters);
    }

    /** The engine; read it only from the driver thread or after {@link #runUntil} returned. */
    public Engine engine() {
        return engine;
    }

    /**
     * Rebuilds the engine (see {@link #loadState}), arms its timers again and settles calls
     * that were in flight: asked again by key where the executor can, else the run stops for
     * a person. Throws {@link TendException} for a snapshot of a newer format, or a journal
     * whose start was archived with no snapshot to cover it.
     */
    public Recovery recover() {
        long[] loaded = loadState();
        long n = loaded[1];
        sinceSnapshot = n;
        Map<String, Instant> armed = engine.armedTimers();
        armed.forEach(effects::arm);
        int again = 0, unknown = 0;
        for (Effect.CallExecutor call : engine.inFlightCalls()) {
            if (effects.canAskAgain(call)) {
                effects.dispatch(call);
                again++;
            } else {
                inbox.add(new Input.OutcomeUnknown(call.runId(), call.stepId(), call.attempt()));
                unknown++;
            }
        }
        return new Recovery(loaded[0], n, armed.size(), again, unknown);
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

    /**
     * Starts the next {@link #recover()} from {@code tail}, an engine a standby kept warm
     * (built on this store and setup): only what was journaled since it last read is read.
     */
    public void adopt(JournalTail tail) {
        snapshots.adopt(tail);
    }

    /**
     * Names the input that {@link #submitEvent} is fed from (a file's identity, see
     * {@link SourceProgress#identity}); from then on each commit also journals how many of its
     * events are done, in the same transaction, so that a reader started again after a crash
     * skips exactly those. Call after {@link #recover()} and before {@link #runUntil}.
     *
     * @return how many events of this source the journal already holds (0 for a new source)
     */
    public long readingFrom(String sourceIdentity) {
        this.source = java.util.Objects.requireNonNull(sourceIdentity, "sourceIdentity");
        sourceDone = snapshots.progressOf(sourceIdentity);
        return sourceDone;
    }

    /**
     * Writes keyed checkpoints into the ledger from now on: at least every
     * {@link CheckpointWriter#EVERY} of processing time while the ledger grows, and when
     * {@link #runUntil} ends.
     */
    public void checkpointWith(CheckpointWriter writer) {
        this.checkpoints = writer;
    }

    /** Queues a transition or topology event; blocks while the queue is full. */
    public void submitEvent(Input in) throws InterruptedException {
        inbox.putEvent(in);
    }

    /**
     * Queues a transition or topology event behind those queued before it (blocking while the
     * queue is full) and completes with its effects once committed. Events are committed in
     * the order queued, so when this completes every event queued before it is committed too.
     */
    public CompletableFuture<List<Effect>> submitEventAndWait(Input in) throws InterruptedException {
        CompletableFuture<List<Effect>> f = waiters.await(in);
        try {
            inbox.putEvent(in);
        } catch (InterruptedException e) {
            waiters.forget(in);
            throw e;
        }
        return f;
    }

    /**
     * As {@link #submitEventAndWait(Input)}, and appends {@code receipt} to the ledger right
     * after the input's own entries, in the transaction that commits it (stamped with the
     * input's processing time): a record of who sent it that costs no commit of its own.
     */
    public CompletableFuture<List<Effect>> submitEventAndWait(Input in, LedgerDraft receipt) throws InterruptedException {
        waiters.withReceipt(in, receipt);
        return submitEventAndWait(in);
    }

    /**
     * As {@link #submitEventAndWait(Input)} for an event read from a stream at {@code at}: the
     * transaction that journals it (or refuses it) also stores {@code at}'s next offset as its
     * partition's position (see {@code StoreTx#putStreamOffset}), so a consumer that seeks to
     * the stored positions takes each record exactly once, across crashes and takeovers.
     * Events of one partition must be queued in offset order.
     */
    public CompletableFuture<List<Effect>> submitEventAt(Input in, StreamPosition at) throws InterruptedException {
        waiters.withPosition(in, at);
        return submitEventAndWait(in);
    }

    /** Queues a timer firing, executor result or operator command; never blocks. */
    public void submit(Input in) {
        inbox.add(in);
    }

    /**
     * Queues an input and completes with its effects once they are committed (for callers
     * that answer a person, such as the HTTP API); completes exceptionally if the commit fails.
     */
    public CompletableFuture<List<Effect>> submitAndWait(Input in) {
        CompletableFuture<List<Effect>> f = waiters.await(in);
        inbox.add(in);
        return f;
    }

    public void stop() {
        stopping = true;
        inbox.wake();
    }

    /** True when no run is executing and no call is in flight. */
    public boolean isIdle() {
        if (effects.callsInFlight() || !inbox.isEmpty()) return false;
        return !engine.isExecuting();
    }

    /** Processes inputs on the calling thread until {@code done} holds with nothing queued, or {@link #stop()}. */
    public void runUntil(BooleanSupplier done) throws InterruptedException {
        boolean failed = true;
        try {
            loop(done);
            failed = false;
            // a clean stop: the next start loads this state and replays nothing
            if (snapshotEvery > 0 && sinceSnapshot > 0) writeSnapshot();
            snapshots.collect(true);
        } finally {
            CheckpointWriter w = checkpoints;
            if (w != null && !failed) w.write(clock.instant()); // at every stop that leaves the store whole
        }
    }

    /**
     * Writes the engine's state, with the progress of the inputs read from files, as the
     * snapshot after the newest journal row (everything committed: the driver calls it
     * between batches).
     */
    private void writeSnapshot() {
        if (snapshots.write(engine, source, sourceDone, clock.instant())) sinceSnapshot = 0;
    }

    /**
     * Group commit that waits on work, not on timers: a batch is whatever waits when the
     * driver looks (up to {@link #BATCH}), committed at once. An input arriving at an idle
     * driver is committed alone, without delay; inputs arriving while a batch is decided and
     * committed wait for that commit and then go together in the next one.
     */
    private void loop(BooleanSupplier done) throws InterruptedException {
        List<Input> batch = new ArrayList<>(BATCH);
        java.util.BitSet queued = new java.util.BitSet(BATCH);
        while (!stopping) {
            batch.clear();
            queued.clear();
            inbox.drainTo(batch, queued, BATCH);
            if (batch.isEmpty()) {
                if (done.getAsBoolean() && inbox.isEmpty()) return;
                CheckpointWriter w = checkpoints;
                if (w != null) w.maybeWrite(clock.instant());
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
        List<InputRow> rows = new ArrayList<>(batch.size());
        List<Effect> all = new ArrayList<>();
        List<Instant> times = new ArrayList<>(batch.size());
        List<List<Effect>> perInput = new ArrayList<>(batch.size());
        try {
            for (int i = 0; i < batch.size(); i++) {
                Input in = batch.get(i);
                Instant now = clock.instant();
                rows.add(InputCodec.encode(in, now));
                List<Effect> fx = engine.handle(in, now);
                all.addAll(fx);
                times.add(now);
                perInput.add(fx);
                if (in instanceof Input.ExecutorResult r && !r.clears().isEmpty()) reportCleared(r, batch);
            }
            long done = sourceDone + queued.cardinality();
            if (source != null && done > sourceDone) rows.add(SourceProgress.row(source, done, times.get(times.size() - 1)));
            writer.batch(batch, rows, times, perInput, waiters.reached(batch));
            sourceDone = done;
            sinceSnapshot += batch.size();
        } catch (RuntimeException e) {
            if (InputRefusal.isDatabaseFailure(e)) stopOn(batch, e);
            // what one input carries cannot be decided or kept: nothing of the batch was written or done
            retryOneByOne(batch, queued);
            return;
        }
        for (Effect e : all) effects.perform(e);
        snapshots.collect(false);
        if (snapshotEvery > 0 && sinceSnapshot >= snapshotEvery) writeSnapshot();
        listener.committed(engine, java.util.Collections.unmodifiableList(batch), java.util.Collections.unmodifiableList(all));
        waiters.committed(batch, perInput);
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

    /**
     * The simulated fleet reports the signals an action cleared, as a health pipeline would:
     * one clear transition per signal at the engine's event time, queued right behind the
     * result in the same batch. On the driver thread, the only one that reads the engine.
     */
    private void reportCleared(Input.ExecutorResult r, List<Input> batch) {
        engine.run(r.runId()).ifPresent(run -> {
            for (Id s : r.clears()) {
                batch.add(Input.Transition.simulatedClear(engine.eventTime(), run.target(), s));
            }
        });
    }
}
