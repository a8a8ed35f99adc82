package dev.tend.api.auth;

import java.time.Duration;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.LongSupplier;

/**
 * Slows down whoever guesses tokens: after {@value #LIMIT} (by default) requests with a wrong
 * token from one address within {@link #WINDOW}, further requests from that address are
 * answered 429 until the oldest failure leaves the window (common practice, no source: the
 * numbers let a person mistype a token a few times and stop a script at once). A request
 * without any token is not a guess and is not counted. Counts per peer address only: no
 * forwarding header is trusted. Thread-safe.
 */
public final class FailedTokens {
    public static final int LIMIT = 10;
    public static final Duration WINDOW = Duration.ofMinutes(1);
    /** Above this many addresses, those without a recent failure are forgotten. */
    private static final int MAX_ADDRESSES = 10_000;

    private final Map<String, Deque<Long>> failures = new ConcurrentHashMap<>();
    private final LongSupplier nanos;
    private final int limit;

    public FailedTokens(int limit, LongSupplier nanos) {
        if (limit < 1) throw new IllegalArgumentException("the limit of wrong tokens must be at least 1, got " + limit);
        this.limit = limit;
        this.nanos = nanos;
    }

    /** {@code limit} wrong tokens a minute per address, on the JVM's monotonic clock. */
    public static FailedTokens systemClock(int limit) {
        return new FailedTokens(limit, System::nanoTime);
    }

    /**
     * Throws when {@code address} used up its failures; the exception says in how many
     * seconds it may try again.
     */
    public void check(String address) {
        Deque<Long> d = failures.get(address);
        if (d == null) return;
        long now = nanos.getAsLong();
        synchronized (d) {
            prune(d, now);
            if (d.size() >= limit) {
                long wait = Math.max(1, (d.peekFirst() + WINDOW.toNanos() - now + 999_999_999L) / 1_000_000_000L);
                throw new TooManyFailuresException(wait);
            }
        }
    }

    /**
     * False while no address has failed: the server then need not work out a request's
     * address before its token is checked.
     */
    public boolean anyFailed() {
        return !failures.isEmpty();
    }

    /** Counts a request from {@code address} whose token was missing or wrong. */
    public void failed(String address) {
        long now = nanos.getAsLong();
        if (failures.size() > MAX_ADDRESSES) forgetQuiet(now);
        Deque<Long> d = failures.computeIfAbsent(address, a -> new ArrayDeque<>());
        synchronized (d) {
            prune(d, now);
            d.addLast(now);
            while (d.size() > limit) d.removeFirst();
        }
    }

    private static void prune(Deque<Long> d, long now) {
        while (!d.isEmpty() && now - d.peekFirst() >= WINDOW.toNanos()) d.removeFirst();
    }

    private void forgetQuiet(long now) {
        failures.entrySet().removeIf(e -> {
            synchronized (e.getValue()) {
                prune(e.getValue(), now);
                return e.getValue().isEmpty();
            }
        });
    }
}
