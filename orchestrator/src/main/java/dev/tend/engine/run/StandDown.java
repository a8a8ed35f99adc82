package dev.tend.engine.run;

import java.util.Locale;
import java.util.Objects;

/**
 * Why a run's gate stopped it before an action step (DESIGN.md section 4, "Gates inside a
 * run"), with a sentence for the ledger.
 *
 * @param reason  which condition
 * @param message what was found, e.g. "heartbeat is clear on fares-17/n2"
 */
public record StandDown(Reason reason, String message) {
    /** The reasons, in the order the gate checks them; {@link #code()} is the wire name. */
    public enum Reason {
        /** An exclusion now covers the run's cluster or node. */
        EXCLUDED,
        /** A mask of the playbook ({@code unless}) now applies. */
        MASKED,
        /** The trigger signal is no longer in breach or silent on the target. */
        CLEARED;

        public String code() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    public StandDown {
        Objects.requireNonNull(reason, "reason");
        Objects.requireNonNull(message, "message");
    }
}
