package dev.tend.handover;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;

/**
 * The half-open span {@code [since, until)} a handover report covers: an entry at
 * {@code since} is in it, an entry at {@code until} is not.
 *
 * @param since the first instant covered, not null
 * @param until the first instant no longer covered, after {@code since}
 */
public record ReportPeriod(Instant since, Instant until) {
    public ReportPeriod {
        Objects.requireNonNull(since, "ReportPeriod.since must not be null");
        Objects.requireNonNull(until, "ReportPeriod.until must not be null");
        if (!until.isAfter(since)) {
            throw new IllegalArgumentException("ReportPeriod.until must be after since " + since + ", got " + until);
        }
    }

    public static ReportPeriod of(Instant since, Instant until) {
        return new ReportPeriod(since, until);
    }

    /** True when {@code t} is at or after {@code since} and before {@code until}. */
    public boolean contains(Instant t) {
        return !t.isBefore(since) && t.isBefore(until);
    }

    public Duration length() {
        return Duration.between(since, until);
    }
}
