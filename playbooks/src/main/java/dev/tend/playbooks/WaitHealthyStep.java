package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.List;
import java.util.Objects;

/**
 * Continues only once every one of {@code signals} is clear on the run's target (the node
 * for a node-scope playbook, the cluster otherwise); fails the run when that has not
 * happened {@code within} the given time.
 */
public record WaitHealthyStep(Id id, List<Id> signals, Duration within) implements Step {
    public WaitHealthyStep {
        Objects.requireNonNull(id, "step id");
        signals = List.copyOf(signals);
        if (signals.isEmpty()) throw new IllegalArgumentException("step " + id + " wait-healthy must name at least one signal");
        Objects.requireNonNull(within, "step " + id + " within");
        if (within.isNegative() || within.isZero()) {
            throw new IllegalArgumentException("step " + id + " within must be longer than zero, got " + within);
        }
    }

    @Override
    public String kind() {
        return "wait-healthy";
    }
}
