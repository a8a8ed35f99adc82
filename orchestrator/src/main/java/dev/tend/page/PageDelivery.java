package dev.tend.page;

import dev.tend.store.Store;

import java.time.Clock;
import java.time.Duration;
import java.util.Objects;

/**
 * The one seam through which a process delivers the page outbox: only the process that owns
 * the engine may send pages, so whatever decides ownership (today: the process that opened
 * the store and runs the driver; with several processes on one database, the one holding the
 * lead) calls {@link #start()} when it takes the engine and {@link #stop()} when it gives it up.
 * Each start runs a fresh {@link Courier}; pages left pending by a stop (or a crash) are sent by
 * the next owner, once, by their stable ids. Thread-safe; start and stop are idempotent.
 */
public final class PageDelivery implements AutoCloseable {
    private final Store store;
    private final Senders senders;
    private final Clock clock;
    private final Duration firstPause;
    private final Courier.Listener listener;
    private Courier courier;

    public PageDelivery(Store store, Senders senders, Clock clock, Duration firstPause, Courier.Listener listener) {
        this.store = Objects.requireNonNull(store, "store");
        this.senders = Objects.requireNonNull(senders, "senders");
        this.clock = Objects.requireNonNull(clock, "clock");
        this.firstPause = Objects.requireNonNull(firstPause, "firstPause");
        this.listener = Objects.requireNonNull(listener, "listener");
    }

    /** This process owns the engine now: deliver what is due, and what the driver commits from now on. */
    public synchronized void start() {
        if (courier == null) courier = new Courier(store, senders, clock, firstPause, listener).start();
    }

    /** This process no longer owns the engine: stop sending (a send under way finishes and is recorded). */
    public synchronized void stop() {
        if (courier != null) {
            courier.close();
            courier = null;
        }
    }

    /** Whether pages are being delivered by this process. */
    public synchronized boolean isDelivering() {
        return courier != null;
    }

    /** New pages were committed: the courier, when running, looks at the outbox now. */
    public synchronized void wake() {
        if (courier != null) courier.wake();
    }

    @Override
    public void close() {
        stop();
    }
}
