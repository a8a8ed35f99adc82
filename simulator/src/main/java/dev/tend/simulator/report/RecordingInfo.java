package dev.tend.simulator.report;

import java.time.Instant;
import java.util.Objects;

/**
 * What was replayed.
 *
 * @param description the header's description, or null
 * @param from        where virtual time started: the header's from, or the first event's time when that is
 *                    earlier or there is no from; null for an empty recording
 * @param until       the header's until, or null when it has none
 * @param horizon     where virtual time stopped: until, else the last event plus two hours
 * @param events      events read
 * @param badLines    lines rejected and skipped
 * @param lateEvents  events older than one already applied for their signal (changed nothing)
 */
public record RecordingInfo(String name, String description, Instant from, Instant until, Instant horizon,
                            long events, long badLines, long lateEvents) {
    public RecordingInfo {
        Objects.requireNonNull(name, "name");
        if (events < 0 || badLines < 0 || lateEvents < 0) {
            throw new IllegalArgumentException("events, badLines and lateEvents must be at least 0");
        }
    }
}
