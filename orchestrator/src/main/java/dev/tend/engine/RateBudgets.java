package dev.tend.engine;

import dev.tend.playbooks.RateLimit;

import java.time.Instant;
import java.util.ArrayDeque;
import java.util.HashMap;
import java.util.Map;
import java.util.function.Supplier;

/**
 * Start budgets as rolling windows: {@code rate: N/W} allows at most N starts in any
 * half-open interval {@code [t, t + W)} of processing time, whatever {@code t} is. Each
 * budget (one per playbook, one for the fleet) keeps the times of its last N starts; a new
 * start is allowed once the oldest of them is at least W in the past. A limiter that refills
 * in fixed periods would let N starts just before a period's end and N more just after it,
 * 2N within moments, which is not what an operator reads in {@code 3/1h}.
 *
 * <p>Kept across restarts: the engine's state is rebuilt by replaying the journal, so every
 * recorded start is taken again at its recorded time and a restart never grants a fresh
 * burst. Memory is N instants per budget. Not thread-safe; the engine's thread only.
 */
final class RateBudgets {
    private final Supplier<Instant> now;
    private final Map<String, ArrayDeque<Instant>> starts = new HashMap<>();

    RateBudgets(Supplier<Instant> now) {
        this.now = now;
    }

    private static String key(String name, RateLimit rate) {
        return name + "|" + rate;
    }

    /** The earliest instant, now or later, at which one more start keeps {@code rate}. */
    Instant nextPermit(String name, RateLimit rate) {
        Instant t = now.get();
        ArrayDeque<Instant> recent = starts.get(key(name, rate));
        if (recent == null || recent.size() < rate.count()) return t;
        Instant freed = recent.peekFirst().plus(rate.period());
        return freed.isAfter(t) ? freed : t;
    }

    /** Records a start now; the caller checked {@link #nextPermit} first. */
    void acquire(String name, RateLimit rate) {
        ArrayDeque<Instant> recent = starts.computeIfAbsent(key(name, rate), k -> new ArrayDeque<>(rate.count() + 1));
        recent.addLast(now.get());
        while (recent.size() > rate.count()) recent.removeFirst();
    }
}
