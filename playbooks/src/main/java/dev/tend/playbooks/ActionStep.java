package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.Objects;

/**
 * Calls an action of {@code actions.yaml} through its executor.
 *
 * @param timeout the step's limit for one attempt, overriding the action's own; null when
 *                the step sets none (then the action's timeout applies, if any)
 * @param retries further attempts after a failed one, 0 to 10; each attempt has its own
 *                idempotency key {@code run-id/step-id/attempt}
 * @param continueIfCleared {@code if-cleared: continue}: the step runs even when the run's
 *                trigger has cleared (a step that must finish what an earlier one began); a
 *                mask or an exclusion still stands the run down before it
 */
public record ActionStep(Id id, Id action, Duration timeout, int retries, boolean continueIfCleared) implements Step {
    public static final int MAX_RETRIES = 10;

    /** A step that the run's gate checks before each attempt ({@code if-cleared: stand-down}, the default). */
    public ActionStep(Id id, Id action, Duration timeout, int retries) {
        this(id, action, timeout, retries, false);
    }

    public ActionStep {
        Objects.requireNonNull(id, "step id");
        Objects.requireNonNull(action, "step " + id + " action");
        if (timeout != null && (timeout.isNegative() || timeout.isZero())) {
            throw new IllegalArgumentException("step " + id + " timeout must be longer than zero, got " + timeout);
        }
        if (retries < 0 || retries > MAX_RETRIES) {
            throw new IllegalArgumentException("step " + id + " retries must be between 0 and " + MAX_RETRIES + ", got " + retries);
        }
    }

    @Override
    public String kind() {
        return "action";
    }
}
