package dev.tend.engine;

import java.time.Instant;

/**
 * The fleet brake: engaged or not, since when, by whom (the name of an operator, or
 * {@code automatic}) and why. {@code manual} brakes release only by hand.
 */
public record BrakeState(boolean engaged, Instant since, String by, String reason, boolean manual) {
    public static BrakeState released() {
        return new BrakeState(false, null, null, null, false);
    }
}
