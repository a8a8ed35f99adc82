package dev.tend.shared.wire;

import java.time.Duration;
import java.time.Instant;
import java.util.function.Supplier;

/**
 * How far ahead of a live input's clock an event's time may be: at most {@code maxSkew}
 * (tend.yaml {@code max-skew}). A time within the limit of a recent reading of the clock is
 * within the current one (the clock has moved on since), so the clock is read every
 * {@link #CLOCK_EVERY} times and for a time beyond the last limit, which is then judged by the
 * clock's reading now: reading it for every line was about a twentieth of a reader's CPU in a
 * 1,000,000-line ingest (DEVELOPERS.md, "Ingest").
 *
 * <p>Safe to share: the limit is published whole; the count of uses since the last reading may
 * lose an increment under a race, which only makes a reading come a little later.
 */
final class AheadLimit {
    static final int CLOCK_EVERY = 64;

    private final Supplier<Instant> clock;
    private final Duration maxSkew;
    private volatile Instant limit;
    private int sinceRead;

    AheadLimit(Supplier<Instant> clock, Duration maxSkew) {
        this.clock = clock;
        this.maxSkew = maxSkew;
    }

    /** Whether {@code at} is at most the skew ahead of the clock. */
    boolean allows(Instant at) {
        Instant l = limit;
        if (l != null && !at.isAfter(l) && ++sinceRead < CLOCK_EVERY) return true;
        l = clock.get().plus(maxSkew);
        limit = l;
        sinceRead = 0;
        return !at.isAfter(l);
    }

    /** The clock's latest reading (after {@link #allows} refused a time: the reading it was judged by). */
    Instant lastReading() {
        Instant l = limit;
        return l == null ? clock.get() : l.minus(maxSkew);
    }
}
