package dev.tend.api.view;

import java.time.Instant;

/**
 * The fleet brake.
 *
 * @param by     an operator's token name, or {@code automatic}; null when released
 * @param manual true when engaged by hand (it then releases only by hand)
 */
public record BrakeView(boolean engaged, Instant since, String by, String reason, boolean manual) {
    public static BrakeView released() {
        return new BrakeView(false, null, null, null, false);
    }
}
