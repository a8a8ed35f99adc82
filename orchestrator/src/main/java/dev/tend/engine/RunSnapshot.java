package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.List;

/**
 * An immutable picture of a run, for projections, the CLI and reports.
 *
 * @param startedAt null until the run started executing
 * @param endedAt   null until the run reached a terminal state
 * @param outcome   null until terminal; then succeeded, failed, cancelled or shadowed with a reason
 */
public record RunSnapshot(String runId, String playbook, int playbookVersion, Target target, RunState state,
                          boolean shadow, Instant createdAt, Instant startedAt, Instant endedAt, String outcome,
                          String currentStep, List<StepSnapshot> steps) {
    public RunSnapshot {
        steps = List.copyOf(steps);
    }
}
