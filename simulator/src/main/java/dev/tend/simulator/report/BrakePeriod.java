package dev.tend.simulator.report;

import java.time.Instant;
import java.util.Objects;

/**
 * A time the fleet brake was engaged in a replay.
 *
 * @param releasedAt null when it was still engaged when the replay stopped
 * @param by         {@code automatic}, or who engaged it
 * @param reason     why, in the engine's words
 */
public record BrakePeriod(Instant engagedAt, Instant releasedAt, String by, String reason) {
    public BrakePeriod {
        Objects.requireNonNull(engagedAt, "engagedAt");
        if (releasedAt != null && releasedAt.isBefore(engagedAt)) {
            throw new IllegalArgumentException("releasedAt (" + releasedAt + ") must not be before engagedAt (" + engagedAt + ")");
        }
    }
}
