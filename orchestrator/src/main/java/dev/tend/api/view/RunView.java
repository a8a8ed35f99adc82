package dev.tend.api.view;

import java.time.Instant;
import java.util.List;

/**
 * A run as the store's projection shows it.
 *
 * @param state   awaiting-approval, held, running, paused, needs-human, succeeded, failed, cancelled or shadowed
 * @param outcome null while the run has not ended
 * @param steps   its steps by ordinal
 */
public record RunView(String run, String playbook, int version, String cluster, String node, String state, boolean shadow,
                      Instant createdAt, Instant startedAt, Instant endedAt, String outcome, String currentStep,
                      List<StepView> steps) {
    public RunView {
        steps = steps == null ? List.of() : List.copyOf(steps);
    }
}
