package dev.tend.shared.fleet;

import java.time.Instant;
import java.util.Objects;

/**
 * A time the fleet brake was engaged, as the handover report (from the ledger) and the
 * replay report (from a replay) show it; it may have begun before the report's period.
 *
 * @param engagedAt     when it was engaged
 * @param engagedBy     who engaged it: an operator's name, or {@code automatic}
 * @param reason        why, as given (an operator's words or the automatic count); may be null
 * @param releasedAt    when it was released; null when still engaged at the period's end
 * @param releasedBy    who released it; null while engaged
 * @param releaseReason why it was released; may be null
 */
public record BrakePeriod(Instant engagedAt, String engagedBy, String reason, Instant releasedAt, String releasedBy,
                          String releaseReason) {
    public BrakePeriod {
        Objects.requireNonNull(engagedAt, "BrakePeriod.engagedAt must not be null");
        Objects.requireNonNull(engagedBy, "BrakePeriod.engagedBy must not be null");
        if (releasedAt != null && releasedAt.isBefore(engagedAt)) {
            throw new IllegalArgumentException("BrakePeriod.releasedAt must not be before engagedAt " + engagedAt + ", got " + releasedAt);
        }
        if (releasedAt == null && releasedBy != null) {
            throw new IllegalArgumentException("BrakePeriod.releasedBy must be null while the brake is engaged (releasedAt null), got '"
                    + releasedBy + "'");
        }
    }

    public boolean isStillEngaged() {
        return releasedAt == null;
    }
}
