package dev.tend.store;

import dev.tend.shared.StepState;

import java.time.Instant;
import java.util.Objects;

/**
 * The projection of one step of a run.
 *
 * @param runId     the run it belongs to
 * @param stepId    the step's id in the playbook
 * @param ordinal   its position in the playbook's steps, from 0
 * @param state     where the step stands
 * @param attempt   how many times it was tried so far, 0 or more
 * @param startedAt when its current attempt started; null before the first
 * @param endedAt   when it ended; null while pending or running
 * @param outcome   how it ended; null while pending or running
 * @param detail    more about the step as JSON text; null when there is nothing more
 */
public record StepRow(String runId, String stepId, int ordinal, StepState state, int attempt, Instant startedAt,
                      Instant endedAt, String outcome, String detail) {
    public StepRow {
        Objects.requireNonNull(runId, "StepRow.runId must not be null");
        Objects.requireNonNull(stepId, "StepRow.stepId must not be null");
        if (ordinal < 0) throw new IllegalArgumentException("StepRow.ordinal must be 0 or more, got " + ordinal);
        Objects.requireNonNull(state, "StepRow.state must not be null");
        if (attempt < 0) throw new IllegalArgumentException("StepRow.attempt must be 0 or more, got " + attempt);
    }
}
