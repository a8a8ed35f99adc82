package dev.tend.engine.run;

import dev.tend.shared.RunState;
import dev.tend.engine.StepSnapshot;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.List;

/**
 * A {@link RunProcess} as plain values, for a snapshot: its playbook by id and version, the
 * trigger its gate checks, where it stands (step index, attempt, whether it is on its
 * failure steps, why its gate stood it down, if it did) and the record of its steps.
 */
public record RunMemo(String id, String playbook, int version, Target target, SignalKey trigger, boolean shadow,
                      Instant createdAt, String requestedBy, RunState state, Instant startedAt, Instant endedAt, String outcome,
                      int index, boolean failing, StandDown standDown, String failedStep, int attempt, Instant stepStartedAt,
                      List<StepSnapshot> steps) {
    public RunMemo {
        steps = List.copyOf(steps);
    }
}
