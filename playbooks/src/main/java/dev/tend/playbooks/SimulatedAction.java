package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.List;
import java.util.Objects;

/**
 * An action for demos and replays: it takes between {@code minDuration} and
 * {@code maxDuration} of (virtual) time, succeeds with probability {@code success}, and on
 * success clears {@code clears} on the target.
 */
public record SimulatedAction(Id id, Duration minDuration, Duration maxDuration, double success, List<Id> clears)
        implements ActionDef {
    public SimulatedAction {
        Objects.requireNonNull(id, "action id");
        Objects.requireNonNull(minDuration, "action " + id + " duration");
        Objects.requireNonNull(maxDuration, "action " + id + " duration");
        if (minDuration.isNegative()) throw new IllegalArgumentException("action " + id + " duration must not be negative");
        if (maxDuration.compareTo(minDuration) < 0) {
            throw new IllegalArgumentException("action " + id + " duration max (" + maxDuration + ") is below min (" + minDuration + ")");
        }
        if (!(success >= 0 && success <= 1)) {
            throw new IllegalArgumentException("action " + id + " success must be a probability between 0 and 1, got " + success);
        }
        clears = List.copyOf(clears);
    }

    @Override
    public String kind() {
        return "simulated";
    }

    /** Simulated actions set no timeout; their duration is bounded by {@link #maxDuration()}. */
    @Override
    public Duration timeout() {
        return null;
    }

    @Override
    public boolean uses(String placeholder) {
        return false;
    }
}
