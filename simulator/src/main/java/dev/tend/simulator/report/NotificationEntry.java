package dev.tend.simulator.report;

import java.time.Instant;
import java.util.Objects;

/** A notification the replayed engine would have sent: when, to which channel, what it said. */
public record NotificationEntry(Instant at, String channel, String message) {
    public NotificationEntry {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(channel, "channel");
        Objects.requireNonNull(message, "message");
    }
}
