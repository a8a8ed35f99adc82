package dev.tend.shared.time;

import java.time.Instant;

/**
 * The timer port. The engine never sleeps or schedules by itself: it asks for a timer as
 * an effect, and an adapter (Quartz in production, a virtual clock in replay and tests)
 * fires it back into the engine as an input. Arming an existing key moves it.
 * Implementations are thread-safe.
 */
public interface Timers {
    void arm(String key, Instant due);

    void cancel(String key);
}
