package dev.tend.shared.fleet;

import java.time.Instant;
import java.util.AbstractList;
import java.util.RandomAccess;

/**
 * An unmodifiable list of instants kept as numbers (seconds and nanoseconds of the epoch): what a
 * snapshot's signal holds of its recent changes ({@link HealthMemo.Signal#changes}), copied from
 * the signal's ring without an {@link Instant} per change. An instant is made when asked for;
 * {@link #epochSecond} and {@link #nano} give the numbers without one. Equal to any list of the
 * same instants, as {@link java.util.List} requires.
 */
public final class InstantList extends AbstractList<Instant> implements RandomAccess {
    private final long[] seconds;
    private final int[] nanos;

    /** The instants {@code seconds[i]}, {@code nanos[i]}: the arrays are the list's from now on, and nobody else's. */
    InstantList(long[] seconds, int[] nanos) {
        if (seconds.length != nanos.length) throw new IllegalArgumentException("seconds and nanoseconds of different lengths");
        this.seconds = seconds;
        this.nanos = nanos;
    }

    @Override
    public Instant get(int index) {
        return Instant.ofEpochSecond(seconds[index], nanos[index]);
    }

    /** {@code get(index).getEpochSecond()}, without the instant. */
    public long epochSecond(int index) {
        return seconds[index];
    }

    /** {@code get(index).getNano()}, without the instant. */
    public int nano(int index) {
        return nanos[index];
    }

    @Override
    public int size() {
        return seconds.length;
    }
}
