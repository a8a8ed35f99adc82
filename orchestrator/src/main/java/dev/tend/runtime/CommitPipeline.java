package dev.tend.runtime;

import dev.tend.engine.Input;
import dev.tend.shared.TendException;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.function.Consumer;

/**
 * The decided batches being committed on the {@link CommitThread} while the driver decides
 * the next ones, oldest first, at most {@link #DEPTH} of them. Their commits run one at a
 * time in the order handed over, and a commit runs only when the one before it succeeded: a
 * batch decided after one whose commit failed was decided on a state that never became
 * durable, so it is not written (its outcome is that failure) and the driver redoes it.
 *
 * <p>Two batches rather than one: with one, the committing thread waited for the driver
 * whenever the driver was slower to decide a batch than the store was to write the one
 * before (on two cores, whenever the reader or another thread had the driver's core), and
 * the driver waited for the commit the rest of the time; a second batch ready behind the one
 * being written keeps the committing thread busy through the driver's slow moments
 * (DEVELOPERS.md, "Ingest"). The driver's thread only; not thread-safe.
 */
final class CommitPipeline implements AutoCloseable {
    /** Batches in flight at most: one being written and one waiting behind it. */
    static final int DEPTH = 2;

    /** A batch whose commit ended: {@code failure} is null when it was committed. */
    record Settled(DecidedBatch batch, RuntimeException failure) {
    }

    private record InFlight(DecidedBatch batch, CompletableFuture<Void> commit) {
    }

    private final ArrayDeque<InFlight> queue = new ArrayDeque<>(DEPTH);
    private final CommitThread thread = new CommitThread();

    boolean isEmpty() {
        return queue.isEmpty();
    }

    int size() {
        return queue.size();
    }

    /** The inputs of the batches in flight. */
    int inputs() {
        int n = 0;
        for (InFlight f : queue) n += f.batch().size();
        return n;
    }

    /** Whether a batch in flight carries the state of the next snapshot ({@link DecidedBatch#stateAfter}). */
    boolean carriesSnapshot() {
        for (InFlight f : queue) if (f.batch().stateAfter() != null) return true;
        return false;
    }

    /** The events of the source journaled once every batch in flight is: {@code settled} when none is. */
    long sourceAfter(long settled) {
        return queue.isEmpty() ? settled : queue.peekLast().batch().sourceAfter();
    }

    /** The inputs of the batches in flight, oldest first. */
    List<Input> pendingInputs() {
        List<Input> all = new ArrayList<>();
        for (InFlight f : queue) all.addAll(f.batch().inputs());
        return all;
    }

    /** Hands {@code b} over: {@code commit} writes it once the batches before it are committed. */
    void start(DecidedBatch b, Consumer<DecidedBatch> commit) {
        if (queue.size() >= DEPTH) throw new IllegalStateException("the commit pipeline is full; settle its oldest batch first");
        CompletableFuture<Void> after = queue.isEmpty() ? null : queue.peekLast().commit();
        queue.addLast(new InFlight(b, thread.start(after, () -> commit.accept(b))));
    }

    /** Waits for the oldest batch's commit and removes it; null when none is in flight. */
    Settled takeOldest() {
        InFlight f = queue.pollFirst();
        return f == null ? null : new Settled(f.batch(), CommitThread.outcome(f.commit()));
    }

    /** Waits for every batch's commit and removes them, oldest first. */
    List<Settled> takeAll() {
        List<Settled> all = new ArrayList<>(queue.size());
        for (Settled s; (s = takeOldest()) != null; ) all.add(s);
        return all;
    }

    /**
     * The driver fails with batches in flight (a listener or a checkpoint threw): their commits
     * are waited for, so that nothing writes to the store once the driver has stopped. Their
     * effects are not performed (the next start arms what was committed, as after a crash) and
     * their callers are told so.
     */
    void abandon(Waiters waiters) {
        for (Settled s : takeAll()) {
            RuntimeException failed = s.failure();
            TendException stopped = new TendException("tend stopped before acting on this input"
                    + (failed == null ? " (it is journaled; the next start resumes from it)" : ": " + failed.getMessage()), failed);
            for (Input in : s.batch().inputs()) waiters.failed(in, stopped);
        }
    }

    @Override
    public void close() {
        thread.close();
    }
}
