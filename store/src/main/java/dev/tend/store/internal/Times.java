package dev.tend.store.internal;

import java.time.Instant;

/**
 * Instants as BIGINT nanoseconds since the epoch, the store's one time format: exact (the
 * journal must replay to the same state) and the same on SQLite and PostgreSQL. Covers
 * 1677-09-21T00:12:43.145224192Z to 2262-04-11T23:47:16.854775807Z.
 */
public final class Times {
    private static final long NANOS = 1_000_000_000L;

    private Times() {
    }

    /** Whole seconds either side of the epoch whose nanoseconds cannot overflow, whatever the fraction. */
    private static final long SAFE_SECONDS = Long.MAX_VALUE / NANOS - 1;

    /** Nanoseconds of {@code t}, or null for null; {@code field} names it in the error. */
    public static Long toNanos(Instant t, String field) {
        return t == null ? null : nanos(t, field);
    }

    /**
     * Nanoseconds of {@code t} (not null), without a box: every journal row and ledger entry
     * passes here; {@code field} names it in the error.
     */
    public static long nanos(Instant t, String field) {
        long seconds = t.getEpochSecond();
        if (seconds > -SAFE_SECONDS && seconds < SAFE_SECONDS) return seconds * NANOS + t.getNano();
        return exact(t, field);
    }

    private static long exact(Instant t, String field) {
        long seconds = t.getEpochSecond();
        int nanos = t.getNano();
        try {
            // Before 1970 with a fraction, count from the next second down, so the earliest nanos do not overflow.
            if (seconds < 0 && nanos > 0) return Math.addExact(Math.multiplyExact(seconds + 1, NANOS), nanos - NANOS);
            return Math.addExact(Math.multiplyExact(seconds, NANOS), nanos);
        } catch (ArithmeticException e) {
            throw new IllegalArgumentException(field + " " + t + " is outside the times the store can keep "
                    + "(1677-09-21 to 2262-04-11 UTC)");
        }
    }

    public static Instant fromNanos(long nanos) {
        return Instant.ofEpochSecond(Math.floorDiv(nanos, NANOS), Math.floorMod(nanos, NANOS));
    }
}
