package dev.tend.runtime;

import dev.tend.audit.CheckpointWriter;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.executor.Executor;
import dev.tend.engine.Input;
import dev.tend.shared.TendException;
import dev.tend.shared.time.Timers;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;

import java.time.Clock;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.function.BooleanSupplier;

/**
 * The live driver around the engine. One thread takes inputs in order, journals each one,
 * lets the engine decide, and commits the journal rows, ledger entries and projections of
 * a batch in one transaction (while the engine decides the next batch, see {@link Driver});
 * only after the commit does it perform side effects (executor calls, timers,
 * notifications). A crash at any moment therefore loses nothing that was acted on, and
 * {@link #recover()} rebuilds the engine by replaying the journal.
 */
public final class Orchestrator {
    /** When snapshots are written unless told otherwise: at an interval that grows with the state (see {@link SnapshotPolicy}). */
    public static final SnapshotPolicy DEFAULT_SNAPSHOTS = SnapshotPolicy.scaled();

    private final Inbox inbox = new Inbox();
    private final EffectRunner effects;
    /** Callers waiting for their input's commit, and receipts to append with an input (see {@link #submitEventAndWait(Input, LedgerDraft)}). */
    private final Waiters waiters = new Waiters();
    private final Driver driver;

    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock) {
        this(store, setup, executors, timers, notifier, clock, CommitListener.NONE);
    }

    /** As above, with a listener told about every committed batch on the driver thread. */
    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock, CommitListener listener) {
        this(store, setup, executors, timers, notifier, clock, listener, DEFAULT_SNAPSHOTS);
    }

    /**
     * As above, writing a snapshot of the engine as {@code snapshots} says and at a clean stop
     * (unless it says never).
     */
    public Orchestrator(Store store, EngineSetup setup, Map<String, Executor> executors, Timers timers,
                        Notifier notifier, Clock clock, CommitListener listener, SnapshotPolicy snapshots) {
        this.effects = new EffectRunner(executors, timers, notifier, inbox);
        this.driver = new Driver(store, setup, clock, listener, snapshots, inbox, effects, waiters);
    }

    /** Batches of at most {@code limit} inputs, before {@link #runUntil} (tests that need several batches). */
    void limitBatches(int limit) {
        driver.limitBatches(limit);
    }

    /** The engine; read it only from the driver thread or after {@link #runUntil} returned. */
    public Engine engine() {
        return driver.engine();
    }

    /**
     * Rebuilds the engine (see {@link Driver#loadState}), arms its timers again and settles calls
     * that were in flight: asked again by key where the executor can, else the run stops for
     * a person. Throws {@link TendException} for a snapshot of a newer format, or a journal
     * whose start was archived with no snapshot to cover it.
     */
    public Recovery recover() {
        long[] loaded = driver.start();
        long n = loaded[1];
        Engine engine = driver.engine();
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
     * Starts the next {@link #recover()} from {@code tail}, an engine a standby kept warm
     * (built on this store and setup): only what was journaled since it last read is read.
     */
    public void adopt(JournalTail tail) {
        driver.snapshots().adopt(tail);
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
        return driver.readFrom(sourceIdentity);
    }

    /**
     * Writes keyed checkpoints into the ledger from now on: at least every
     * {@link CheckpointWriter#EVERY} of processing time while the ledger grows, and when
     * {@link #runUntil} ends.
     */
    public void checkpointWith(CheckpointWriter writer) {
        driver.checkpointWith(writer);
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
     * As {@link #submitEventAndWait(Input)}, with a record of who sent it that costs no commit of
     * its own: a {@code transitions-received} receipt is added to its caller's open receipt in
     * the transaction that commits the input, and reaches the ledger about a second later with
     * the caller's other requests of that second ({@link ReceiptCloser}); any other receipt is
     * appended to the ledger right after the input's own entries (stamped with the input's
     * processing time).
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

    /**
     * Tells waiting callers on {@code executor} (a committed batch's in one task) instead of on
     * the driver thread: for callers that do more on completion than wake up, such as an HTTP
     * route writing its answer. The executor must not run tasks on the calling thread.
     */
    public void answerOn(java.util.concurrent.Executor executor) {
        waiters.answerOn(executor);
    }

    public void stop() {
        driver.stop();
    }

    /** True when no run is executing and no call is in flight. */
    public boolean isIdle() {
        if (effects.callsInFlight() || !inbox.isEmpty()) return false;
        return !driver.engine().isExecuting();
    }

    /** Processes inputs on the calling thread until {@code done} holds with nothing queued, or {@link #stop()}. */
    public void runUntil(BooleanSupplier done) throws InterruptedException {
        driver.run(done);
    }
}
