package dev.tend.shared.time;

import java.time.Instant;

/**
 * The instants tend can keep: the store writes times as 64-bit nanoseconds since 1970, so
 * from 1677-09-21T00:12:43.145224192Z to 2262-04-11T23:47:16.854775807Z. A time outside is
 * refused where it is read (a replay's line, say) instead of failing later where it is kept.
 */
public final class TimeLimits {
    public static final Instant EARLIEST = Instant.ofEpochSecond(0, Long.MIN_VALUE);
    public static final Instant LATEST = Instant.ofEpochSecond(0, Long.MAX_VALUE);

    private TimeLimits() {
    }

    public static boolean isKeepable(Instant t) {
        return !t.isBefore(EARLIEST) && !t.isAfter(LATEST);
    }

    /** The sentence that says why {@code t} is refused. */
    public static String outside(Instant t) {
        return t + " is outside the times tend can keep (1677-09-21 to 2262-04-11 UTC)";
    }
}
