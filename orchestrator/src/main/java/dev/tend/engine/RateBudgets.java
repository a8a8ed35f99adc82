package dev.tend.engine;

import dev.tend.playbooks.RateLimit;
import io.github.resilience4j.ratelimiter.RateLimiterConfig;
import io.github.resilience4j.ratelimiter.internal.AtomicRateLimiter;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;

/**
 * Start budgets: one resilience4j {@link AtomicRateLimiter} per playbook and one for the
 * fleet, fed the engine's processing time through their nano-time supplier, never the
 * system clock. Because the engine's state is rebuilt by replaying the journal, every
 * recorded start is replayed through these limiters at its recorded time: a restart never
 * grants a fresh burst.
 *
 * <p>For snapshots each budget also remembers when its limiter was made and the starts of
 * its current refresh period: a limiter refills whole at each period's start and never
 * above its limit, so those starts, taken again at their times on a limiter made at the
 * same instant, give back the same limiter.
 */
final class RateBudgets {
    private final Supplier<Instant> now;
    private final Map<String, Budget> budgets = new LinkedHashMap<>();
    private final Map<String, AtomicRateLimiter> limiters = new LinkedHashMap<>();
    /** Set while a snapshot's budgets are rebuilt: the time their limiters see. */
    private Instant rebuildingAt;

    /** What a snapshot keeps of one limiter: when it was made and the starts of its current period. */
    private static final class Budget {
        final String name;
        final RateLimit rate;
        final Instant created;
        final List<Instant> thisPeriod = new ArrayList<>();

        Budget(String name, RateLimit rate, Instant created) {
            this.name = name;
            this.rate = rate;
            this.created = created;
        }

        long period(Instant t) {
            return Duration.between(created, t).toNanos() / rate.period().toNanos();
        }

        void started(Instant t) {
            if (!thisPeriod.isEmpty() && period(thisPeriod.get(thisPeriod.size() - 1)) != period(t)) thisPeriod.clear();
            thisPeriod.add(t);
        }
    }

    RateBudgets(Supplier<Instant> now) {
        this.now = now;
    }

    private Instant time() {
        return rebuildingAt != null ? rebuildingAt : now.get();
    }

    private long nanos() {
        Instant t = time();
        return t.getEpochSecond() * 1_000_000_000L + t.getNano();
    }

    private AtomicRateLimiter limiter(String name, RateLimit rate) {
        String key = name + "|" + rate;
        return limiters.computeIfAbsent(key, k -> {
            budgets.put(k, new Budget(name, rate, time()));
            return new AtomicRateLimiter(name, RateLimiterConfig.custom()
                    .limitForPeriod(rate.count())
                    .limitRefreshPeriod(rate.period())
                    .timeoutDuration(Duration.ZERO)
                    .build(), this::nanos);
        });
    }

    private boolean acquireAt(String name, RateLimit rate, Instant t) {
        boolean ok = limiter(name, rate).acquirePermission(1);
        if (ok) budgets.get(name + "|" + rate).started(t);
        return ok;
    }

    /** The instant a permit is available (now when one is). */
    Instant nextPermit(String name, RateLimit rate) {
        AtomicRateLimiter l = limiter(name, rate);
        if (l.getDetailedMetrics().getAvailablePermissions() > 0) return now.get();
        long wait = l.getDetailedMetrics().getNanosToWait();
        if (wait <= 0) wait = 1;
        return now.get().plusNanos(wait);
    }

    boolean acquire(String name, RateLimit rate) {
        return acquireAt(name, rate, now.get());
    }

    /** Every budget, in the order first used. */
    List<EngineState.Budget> memo() {
        List<EngineState.Budget> out = new ArrayList<>(budgets.size());
        for (Budget b : budgets.values()) {
            out.add(new EngineState.Budget(b.name, b.rate.count(), b.rate.period(), b.created, b.thisPeriod));
        }
        return out;
    }

    /** Rebuilds the budgets of a snapshot: each limiter made at its instant and given its starts again at theirs. */
    void restore(List<EngineState.Budget> memo) {
        budgets.clear();
        limiters.clear();
        try {
            for (EngineState.Budget m : memo) {
                RateLimit rate = new RateLimit(m.count(), m.period());
                rebuildingAt = m.created();
                limiter(m.name(), rate);
                for (Instant t : m.starts()) {
                    rebuildingAt = t;
                    if (!acquireAt(m.name(), rate, t)) throw new IllegalStateException("the start budget " + m.name() + " refused a start at " + t
                            + " that it had granted; the snapshot does not match this engine");
                }
            }
        } finally {
            rebuildingAt = null;
        }
    }
}
