package dev.tend.playbooks;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;

import java.time.Duration;
import java.util.Map;
import java.util.Objects;

/**
 * A playbook's {@code trigger}: the transitions it reacts to.
 *
 * @param signal     the signal, not null
 * @param state      {@code breach} or {@code silent}; a playbook reacts to a problem, and
 *                   {@code clear} ends one, so {@code clear} is rejected
 * @param scope      {@code node}: the transition must name a node; {@code cluster}: it must not
 * @param confirmFor how long the problem must last in event time before a run may start;
 *                   zero (the default) starts at once
 * @param clusters   which clusters, by tags; {@link TagSelector#all()} when not given
 */
public record Trigger(Id signal, SignalState state, Scope scope, Duration confirmFor, TagSelector clusters) {
    public Trigger {
        Objects.requireNonNull(signal, "trigger.signal");
        Objects.requireNonNull(state, "trigger.state");
        Objects.requireNonNull(scope, "trigger.scope");
        if (state == SignalState.CLEAR) {
            throw new IllegalArgumentException("trigger.state must be breach or silent: a playbook reacts to a problem, and clear ends one");
        }
        confirmFor = confirmFor == null ? Duration.ZERO : confirmFor;
        if (confirmFor.isNegative()) throw new IllegalArgumentException("trigger.confirm-for must not be negative, got " + confirmFor);
        clusters = clusters == null ? TagSelector.all() : clusters;
    }

    /** A trigger with no confirmation delay that matches every cluster. */
    public static Trigger of(String signal, SignalState state, Scope scope) {
        return new Trigger(Id.of(signal), state, scope, Duration.ZERO, TagSelector.all());
    }

    /**
     * True when {@code t} is this trigger's signal and state, at this scope (node scope needs
     * a node, cluster scope needs none), on a cluster whose tags the selector matches.
     */
    public boolean matches(HealthTransition t, Map<String, String> clusterTags) {
        return t.signal().equals(signal)
                && t.state() == state
                && (scope == Scope.NODE) == (t.node() != null)
                && clusters.matches(clusterTags);
    }

    /** True when both triggers react to the same signal, state and scope (tags aside). */
    public boolean sameEvent(Trigger other) {
        return signal.equals(other.signal) && state == other.state && scope == other.scope;
    }
}
