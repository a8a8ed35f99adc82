package dev.tend.engine.guard;

import dev.tend.shared.ReasonCode;

import java.time.Instant;
import java.util.Objects;

/**
 * One guard's reason not to start now.
 *
 * @param retryAt          processing time at which the reason may be gone (null if not time-based)
 * @param retryAtEventTime event time at which the reason may be gone (null if not event-time based)
 */
public record Objection(ReasonCode code, String message, Wake wake, Instant retryAt, Instant retryAtEventTime) {
    public Objection {
        Objects.requireNonNull(code, "code");
        Objects.requireNonNull(message, "message");
        Objects.requireNonNull(wake, "wake");
        if (wake == Wake.TIME && retryAt == null) throw new IllegalArgumentException("a TIME objection needs retryAt");
        if (wake == Wake.EVENT_TIME && retryAtEventTime == null) {
            throw new IllegalArgumentException("an EVENT_TIME objection needs retryAtEventTime");
        }
    }

    public static Objection until(ReasonCode code, Instant retryAt, String message) {
        return new Objection(code, message, Wake.TIME, retryAt, null);
    }

    public static Objection untilEventTime(ReasonCode code, Instant eventTime, String message) {
        return new Objection(code, message, Wake.EVENT_TIME, null, eventTime);
    }

    public static Objection on(ReasonCode code, Wake wake, String message) {
        return new Objection(code, message, wake, null, null);
    }
}
