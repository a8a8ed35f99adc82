package dev.tend.handover;

import java.time.Instant;
import java.util.Objects;

/**
 * A page that reached its channel ({@link #DELIVERED}) or was given up ({@link #FAILED}) in a
 * report's period, from the ledger's {@code notification-delivered} and final
 * {@code notification-failed} entries.
 *
 * @param kind     what the page was about (brake, flapping, needs-human, ...), or null when not recorded
 * @param attempts the attempts it took
 * @param answer   the receiver's last answer
 */
public record PageLine(Instant at, String id, String channel, String kind, String outcome, int attempts, String answer) {
    public static final String DELIVERED = "delivered";
    public static final String FAILED = "failed";

    public PageLine {
        Objects.requireNonNull(at, "PageLine.at must not be null");
        Objects.requireNonNull(id, "PageLine.id must not be null");
        Objects.requireNonNull(channel, "PageLine.channel must not be null");
        if (!DELIVERED.equals(outcome) && !FAILED.equals(outcome)) {
            throw new IllegalArgumentException("PageLine.outcome must be delivered or failed, got '" + outcome + "'");
        }
    }
}
