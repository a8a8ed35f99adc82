package dev.tend.simulator.report;

import dev.tend.shared.Problem;

import java.time.Instant;
import java.util.List;
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
 * @param problems    every bad line's located problem, in line order (all of them: a report is where a
 *                    person finds each line to fix)
 */
public record RecordingInfo(String name, String description, Instant from, Instant until, Instant horizon,
                            long events, long badLines, long lateEvents, List<Problem> problems) {
    /** A recording whose bad lines are counted only. */
    public RecordingInfo(String name, String description, Instant from, Instant until, Instant horizon,
                         long events, long badLines, long lateEvents) {
        this(name, description, from, until, horizon, events, badLines, lateEvents, List.of());
    }

    public RecordingInfo {
        Objects.requireNonNull(name, "name");
        problems = List.copyOf(problems);
        if (events < 0 || badLines < 0 || lateEvents < 0) {
            throw new IllegalArgumentException("events, badLines and lateEvents must be at least 0");
        }
    }
}
