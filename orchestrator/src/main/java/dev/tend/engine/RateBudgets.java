package dev.tend.engine;

import dev.tend.playbooks.RateLimit;

import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
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
 *
 * <p>A snapshot keeps each budget's name, rate and its last N starts ({@link #memo}); that is
 * all a rolling window remembers, so {@link #restore} gives back the same budgets.
 */
final class RateBudgets {
    private final Supplier<Instant> now;
    private final Map<String, ArrayDeque<Instant>> starts = new HashMap<>();
    private final Map<String, EngineState.Budget> named = new HashMap<>();

    RateBudgets(Supplier<Instant> now) {
        this.now = now;
    }

    /** Each budget name's last key, with its rate: the key's text (the rate formatted) is made once, not at every check. */
    private final Map<String, Keyed> keys = new HashMap<>();

    private record Keyed(RateLimit rate, String key) {
    }

    private String key(String name, RateLimit rate) {
        Keyed k = keys.get(name);
        if (k == null || !k.rate().equals(rate)) {
            k = new Keyed(rate, name + "|" + rate);
            keys.put(name, k);
        }
        return k.key();
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
        ArrayDeque<Instant> recent = starts.computeIfAbsent(key(name, rate), k -> {
            named.put(k, new EngineState.Budget(name, rate.count(), rate.period(), List.of()));
            return new ArrayDeque<>(rate.count() + 1);
        });
        recent.addLast(now.get());
        while (recent.size() > rate.count()) recent.removeFirst();
    }

    /** Every budget used so far with its recent starts, oldest first; ordered by name and rate. */
    List<EngineState.Budget> memo() {
        List<EngineState.Budget> out = new ArrayList<>(starts.size());
        starts.keySet().stream().sorted().forEach(k -> {
            EngineState.Budget b = named.get(k);
            out.add(new EngineState.Budget(b.name(), b.count(), b.period(), List.copyOf(starts.get(k))));
        });
        return out;
    }

    /** Puts back the budgets of a snapshot, replacing every budget this engine holds. */
    void restore(List<EngineState.Budget> memo) {
        starts.clear();
        named.clear();
        for (EngineState.Budget m : memo) {
            RateLimit rate = new RateLimit(m.count(), m.period());
            if (m.starts().size() > rate.count()) throw new IllegalStateException("the start budget " + m.name() + " holds "
                    + m.starts().size() + " starts, more than its rate " + rate + " allows; the snapshot does not match this engine");
            String k = key(m.name(), rate);
            starts.put(k, new ArrayDeque<>(m.starts()));
            named.put(k, m);
        }
    }
}
