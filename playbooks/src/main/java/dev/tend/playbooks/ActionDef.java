package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;

/**
 * An action of {@code actions.yaml}: what an executor of {@link #kind()} runs for a step.
 * Every call carries the idempotency key {@code run-id/step-id/attempt} ({@code {key}}).
 */
public sealed interface ActionDef permits CommandAction, HttpAction, SimulatedAction {
    Id id();

    /** The executor kind: {@code command}, {@code http} or {@code simulated}. */
    String kind();

    /** The action's own limit for one attempt, or null when it sets none. */
    Duration timeout();

    /** True when some template of the action uses {@code {placeholder}}. */
    boolean uses(String placeholder);
}
