package dev.tend.shared.time;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.concurrent.atomic.AtomicReference;

/**
 * A clock that moves only when told to: for replay and for tests, so that nothing waits
 * for real time. Never goes backwards. Thread-safe.
 */
public final class VirtualClock extends Clock {
    private final AtomicReference<Instant> now;
    private final ZoneId zone;

    private VirtualClock(AtomicReference<Instant> now, ZoneId zone) {
        this.now = now;
        this.zone = zone;
    }

    public static VirtualClock at(Instant start) {
        return new VirtualClock(new AtomicReference<>(start), ZoneOffset.UTC);
    }

    /** Moves the clock to {@code t}; an earlier instant leaves it where it is. */
    public void advanceTo(Instant t) {
        now.accumulateAndGet(t, (a, b) -> b.isAfter(a) ? b : a);
    }

    public void advance(Duration d) {
        if (d.isNegative()) throw new IllegalArgumentException("a virtual clock never goes backwards: " + d);
        now.updateAndGet(a -> a.plus(d));
    }

    @Override
    public ZoneId getZone() {
        return zone;
    }

    @Override
    public Clock withZone(ZoneId z) {
        return new VirtualClock(now, z);
    }

    @Override
    public Instant instant() {
        return now.get();
    }
}
