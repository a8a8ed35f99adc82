package dev.tend.serve;

import dev.tend.shared.time.Timers;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.Objects;
import java.util.function.LongSupplier;

/**
 * How a server's processing time relates to the wall clock. {@link #real()}: processing time
 * is the wall clock. {@link #accelerated(Instant, double)}: processing time begins at a given
 * instant and runs {@code factor} times faster than the wall clock ({@code tend demo}), so
 * step timeouts, approval expiry, cooldowns and confirm-for all pass {@code factor} times
 * sooner; a timer due at a processing time is armed for the wall-clock instant at which the
 * processing clock reaches it. Immutable and thread-safe.
 */
public final class TimeScale {
    /** Largest factor accepted: beyond it a 5-minute confirm-for would pass in a few milliseconds. */
    public static final double MAX_FACTOR = 10_000;

    private final Instant start;
    private final double factor;
    private final Instant wallStart;
    private final long startNanos;
    private final LongSupplier nanos;

    private TimeScale(Instant start, double factor, Instant wallStart, long startNanos, LongSupplier nanos) {
        this.start = start;
        this.factor = factor;
        this.wallStart = wallStart;
        this.startNanos = startNanos;
        this.nanos = nanos;
    }

    /** Processing time is the wall clock (UTC). */
    public static TimeScale real() {
        return new TimeScale(null, 1, null, 0, System::nanoTime);
    }

    /** Processing time begins at {@code start} now and runs {@code factor} times faster than the wall clock. */
    public static TimeScale accelerated(Instant start, double factor) {
        return accelerated(start, factor, Instant.now(), System::nanoTime);
    }

    /**
     * As {@link #accelerated(Instant, double)}, with the wall clock's current instant and its
     * monotonic nanosecond source given (tests).
     */
    static TimeScale accelerated(Instant start, double factor, Instant wallNow, LongSupplier nanos) {
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(wallNow, "wallNow");
        Objects.requireNonNull(nanos, "nanos");
        if (!(factor >= 1 && factor <= MAX_FACTOR)) {
            throw new IllegalArgumentException("time scale factor must be from 1 to " + (long) MAX_FACTOR + ", got " + factor);
        }
        return new TimeScale(start, factor, wallNow, nanos.getAsLong(), nanos);
    }

    public boolean isReal() {
        return start == null;
    }

    /** How many times faster than the wall clock processing time runs (1 when real). */
    public double factor() {
        return factor;
    }

    /** The processing clock, in UTC. */
    public Clock clock() {
        return isReal() ? Clock.systemUTC() : new Scaled(ZoneOffset.UTC);
    }

    /** The wall-clock instant at which the processing clock shows {@code processing}. */
    public Instant wallTimeOf(Instant processing) {
        Objects.requireNonNull(processing, "processing");
        if (isReal()) return processing;
        long sinceStartNanos = Duration.between(start, processing).toNanos();
        return wallStart.plusNanos((long) (sinceStartNanos / factor));
    }

    /** {@code wall} (timers that fire by the wall clock) seen from the processing clock. */
    public Timers onProcessingTime(Timers wall) {
        Objects.requireNonNull(wall, "wall");
        if (isReal()) return wall;
        return new Timers() {
            @Override
            public void arm(String key, Instant due) {
                wall.arm(key, wallTimeOf(due));
            }

            @Override
            public void cancel(String key) {
                wall.cancel(key);
            }
        };
    }

    private Instant processingNow() {
        long elapsed = nanos.getAsLong() - startNanos;
        return start.plusNanos((long) (elapsed * factor));
    }

    private final class Scaled extends Clock {
        private final ZoneId zone;

        Scaled(ZoneId zone) {
            this.zone = zone;
        }

        @Override
        public ZoneId getZone() {
            return zone;
        }

        @Override
        public Clock withZone(ZoneId newZone) {
            return new Scaled(newZone);
        }

        @Override
        public Instant instant() {
            return processingNow();
        }
    }

    @Override
    public String toString() {
        return isReal() ? "real time" : "processing time from " + start + " at " + factor + "x the wall clock";
    }
}
