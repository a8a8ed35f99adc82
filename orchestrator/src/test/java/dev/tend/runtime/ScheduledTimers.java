package dev.tend.runtime;

import dev.tend.shared.time.Timers;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.ScheduledFuture;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;

/**
 * Wall-clock timers on a plain scheduled executor, for tests and benchmarks that drive an
 * orchestrator on a {@link Clock} of their own; {@code tend serve} and {@code tend ingest} use
 * {@link QuartzTimers}. A timer whose time has passed fires at once.
 */
public final class ScheduledTimers implements Timers, AutoCloseable {
    private final ScheduledExecutorService pool = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "tend-timers");
        t.setDaemon(true);
        return t;
    });
    private final Map<String, ScheduledFuture<?>> armed = new ConcurrentHashMap<>();
    private final Clock clock;
    private final Consumer<String> fire;

    public ScheduledTimers(Clock clock, Consumer<String> fire) {
        this.clock = clock;
        this.fire = fire;
    }

    @Override
    public void arm(String key, Instant due) {
        long delay = Math.max(0, Duration.between(clock.instant(), due).toMillis());
        ScheduledFuture<?> f = pool.schedule(() -> {
            armed.remove(key);
            fire.accept(key);
        }, delay, TimeUnit.MILLISECONDS);
        ScheduledFuture<?> old = armed.put(key, f);
        if (old != null) old.cancel(false);
    }

    @Override
    public void cancel(String key) {
        ScheduledFuture<?> f = armed.remove(key);
        if (f != null) f.cancel(false);
    }

    public int armedCount() {
        return armed.size();
    }

    @Override
    public void close() {
        pool.shutdownNow();
    }
}
