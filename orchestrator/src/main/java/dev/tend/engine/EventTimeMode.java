package dev.tend.engine;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;

/**
 * How the engine's event time (the clock of confirm-for and flapping) advances.
 * {@link #eventsOnly()}: only with the event times of arriving events (ingesting a file of
 * past events). {@link #following(Duration)}: also with processing time minus a lag, so
 * that a problem is confirmed even when no further event arrives (serve, replay).
 */
public record EventTimeMode(Duration lag) {
    public static EventTimeMode eventsOnly() {
        return new EventTimeMode(null);
    }

    public static EventTimeMode following(Duration lag) {
        Objects.requireNonNull(lag, "lag");
        if (lag.isNegative()) throw new IllegalArgumentException("the event-time lag must not be negative, got " + lag);
        return new EventTimeMode(lag);
    }

    public boolean follows() {
        return lag != null;
    }

    /** The processing time at which event time reaches {@code eventTime}, or null in events-only mode. */
    public Instant processingTimeFor(Instant eventTime) {
        return lag == null ? null : eventTime.plus(lag);
    }
}
