package dev.tend.engine;

import dev.tend.playbooks.RateLimit;
import io.github.resilience4j.ratelimiter.RateLimiterConfig;
import io.github.resilience4j.ratelimiter.internal.AtomicRateLimiter;

import java.time.Duration;
import java.time.Instant;
import java.util.HashMap;
import java.util.Map;
import java.util.function.Supplier;

/**
 * Start budgets: one resilience4j {@link AtomicRateLimiter} per playbook and one for the
 * fleet, fed the engine's processing time through their nano-time supplier, never the
 * system clock. Because the engine's state is rebuilt by replaying the journal, every
 * recorded start is replayed through these limiters at its recorded time: a restart never
 * grants a fresh burst.
 */
final class RateBudgets {
    private final Supplier<Instant> now;
    private final Map<String, AtomicRateLimiter> limiters = new HashMap<>();

    RateBudgets(Supplier<Instant> now) {
        this.now = now;
    }

    private long nanos() {
        Instant t = now.get();
        return t.getEpochSecond() * 1_000_000_000L + t.getNano();
    }

    private AtomicRateLimiter limiter(String name, RateLimit rate) {
        String key = name + "|" + rate;
        return limiters.computeIfAbsent(key, k -> new AtomicRateLimiter(name, RateLimiterConfig.custom()
                .limitForPeriod(rate.count())
                .limitRefreshPeriod(rate.period())
                .timeoutDuration(Duration.ZERO)
                .build(), this::nanos));
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
        return limiter(name, rate).acquirePermission(1);
    }
}
