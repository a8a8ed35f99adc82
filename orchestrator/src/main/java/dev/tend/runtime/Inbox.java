package dev.tend.runtime;

import dev.tend.engine.Input;

import java.util.BitSet;
import java.util.List;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.locks.LockSupport;

/**
 * What waits for the driver: urgent inputs (timer firings, executor results, operator
 * commands; unbounded, taken first) and events (transitions and topology events; bounded, so
 * a fast reader blocks instead of filling the heap). Every input wakes the driver at once:
 * it never sleeps on a timer while work is waiting, and whatever arrives while it decides and
 * commits a batch is taken together as the next one (group commit that gathers only while a
 * commit is in flight).
 */
final class Inbox {
    private static final int EVENTS_CAPACITY = 20_000;

    private final BlockingQueue<Input> urgent = new LinkedBlockingQueue<>();
    private final BlockingQueue<Input> events = new ArrayBlockingQueue<>(EVENTS_CAPACITY);
    /**
     * The thread parked in {@link #awaitInput}, null when none is: set before it looks at the
     * queues, so no wake-up is lost, and cleared after, so that an input does not wake the
     * driver where it waits for something else (a commit: once per event of a file, 22,847
     * needless wake-ups of the driver in a 1,000,000-line ingest, DEVELOPERS.md "Ingest").
     */
    private volatile Thread driver;

    /** Queues an event; blocks while the events queue is full. */
    void putEvent(Input in) throws InterruptedException {
        events.put(in);
        wake();
    }

    /** Queues an urgent input; never blocks. */
    void add(Input in) {
        urgent.add(in);
        wake();
    }

    boolean isEmpty() {
        return urgent.isEmpty() && events.isEmpty();
    }

    /**
     * Moves what is waiting into {@code batch}, urgent inputs first, until it holds {@code max};
     * marks in {@code fromEvents} the positions of the inputs taken from the events queue.
     */
    void drainTo(List<Input> batch, BitSet fromEvents, int max) {
        urgent.drainTo(batch, max - batch.size());
        if (batch.size() < max) {
            int n = events.drainTo(batch, max - batch.size());
            if (n > 0) fromEvents.set(batch.size() - n, batch.size());
        }
    }

    /** Parks the calling thread until an input arrives, {@link #wake()} is called, or {@code nanos} pass. */
    void awaitInput(long nanos) {
        driver = Thread.currentThread();
        if (isEmpty()) LockSupport.parkNanos(this, nanos);
        driver = null;
    }

    /** Wakes the thread waiting in {@link #awaitInput} (or lets its next wait return at once). */
    void wake() {
        Thread t = driver;
        if (t != null) LockSupport.unpark(t);
    }
}
