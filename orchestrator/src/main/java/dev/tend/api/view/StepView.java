package dev.tend.api.view;

import java.time.Instant;

/**
 * One step of a run.
 *
 * @param kind  action, wait-healthy or page
 * @param state pending, running, succeeded, failed, timed-out, skipped or unknown
 */
public record StepView(String step, int ordinal, String kind, String state, int attempt, Instant startedAt,
                       Instant endedAt, String outcome) {
}
