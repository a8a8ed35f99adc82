package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * An armed timer. Arming a key that is already armed moves it.
 *
 * @param key     the timer's key, unique
 * @param due     when it fires
 * @param payload what to hand back when it fires, as JSON text; null when nothing
 */
public record TimerRow(String key, Instant due, String payload) {
    public TimerRow {
        Objects.requireNonNull(key, "TimerRow.key must not be null");
        if (key.isEmpty()) throw new IllegalArgumentException("TimerRow.key must not be empty");
        Objects.requireNonNull(due, "TimerRow.due must not be null");
    }
}
