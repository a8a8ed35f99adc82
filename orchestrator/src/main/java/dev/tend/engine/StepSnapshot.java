package dev.tend.engine;

import java.time.Instant;

/**
 * One step of a run as it stands.
 *
 * @param state   pending, running, succeeded, failed, timed-out, skipped
 * @param attempt 1-based attempt of an action step, 0 before it started
 */
public record StepSnapshot(String stepId, int ordinal, String kind, String state, int attempt,
                           Instant startedAt, Instant endedAt, String outcome) {
}
