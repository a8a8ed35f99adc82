package dev.tend.simulator.report;

import java.time.Instant;
import java.util.Objects;

/**
 * One step of a replayed run as it ended up.
 *
 * @param kind      action, wait-healthy or page
 * @param state     succeeded, failed, timed-out, running, ...
 * @param attempt   the attempt of an action step, 0 for other kinds
 * @param startedAt null when not known
 * @param endedAt   null while running
 * @param outcome   the engine's words, or null
 */
public record StepEntry(String step, String kind, String state, int attempt, Instant startedAt, Instant endedAt,
                        String outcome) {
    public StepEntry {
        Objects.requireNonNull(step, "step");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(state, "state");
        if (attempt < 0) throw new IllegalArgumentException("attempt must be at least 0, got " + attempt);
    }
}
