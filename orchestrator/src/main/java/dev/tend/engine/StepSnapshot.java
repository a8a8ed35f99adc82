package dev.tend.engine;

import dev.tend.shared.StepState;
import java.time.Instant;

/**
 * One step of a run as it stands.
 *
 * @param state   where it stands (the store and reports carry its {@link StepState#wireName()})
 * @param attempt 1-based attempt of an action step, 0 before it started
 */
public record StepSnapshot(String stepId, int ordinal, String kind, StepState state, int attempt,
                           Instant startedAt, Instant endedAt, String outcome) {
}
