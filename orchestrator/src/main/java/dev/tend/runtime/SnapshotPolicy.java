package dev.tend.runtime;

/**
 * When the driver writes a snapshot of the engine: every {@link #every()} inputs as the user
 * chose, never, or (the default, {@link #scaled()}) at an interval that grows with the state.
 *
 * <p>Why scaled: a snapshot writes the whole state, so its cost grows with the health view's
 * signals (on a fleet of 2,000 clusters 56,000 signals, about 0.2 s of CPU each, measured
 * 2026-12-03), while what it saves, the inputs a start replays after it, grows with the
 * interval. An interval of {@value #PER_SIGNAL} inputs per signal keeps the snapshots' share
 * of ingest's CPU the same whatever the fleet's size (about 4 µs per signal per snapshot,
 * spread over {@value #PER_SIGNAL} inputs per signal: under 1 µs an input), and never under
 * {@value #FLOOR} inputs (a small fleet's snapshot is cheap) nor over {@value #CAP} (the
 * inputs a start may have to replay, about 25 µs of CPU each: a start stays well inside the
 * design's 15 s, see DEVELOPERS.md "Snapshots").
 *
 * @param every inputs between two snapshots when the user chose them (0: never); 0 when {@code followsState}
 * @param followsState the interval follows the state ({@link #intervalFor})
 */
public record SnapshotPolicy(int every, boolean followsState) {
    /** Inputs between two snapshots per signal the health view knows, under {@link #scaled()}. */
    public static final int PER_SIGNAL = 5;
    /** The shortest interval {@link #scaled()} picks. */
    public static final int FLOOR = 50_000;
    /** The longest interval {@link #scaled()} picks: the most inputs a start replays after a snapshot. */
    public static final int CAP = 200_000;

    public SnapshotPolicy {
        if (every < 0) throw new IllegalArgumentException("snapshot every must be 0 (never) or more inputs, got " + every);
        if (followsState && every != 0) throw new IllegalArgumentException("a scaled snapshot policy takes no fixed interval, got " + every);
    }

    /** The default: an interval of {@value #PER_SIGNAL} inputs per signal, within {@value #FLOOR} to {@value #CAP}. */
    public static SnapshotPolicy scaled() {
        return new SnapshotPolicy(0, true);
    }

    /** A snapshot every {@code inputs} inputs exactly (0: never). */
    public static SnapshotPolicy every(int inputs) {
        return new SnapshotPolicy(inputs, false);
    }

    /** True unless snapshots are off ({@code every(0)}). */
    public boolean isEnabled() {
        return followsState || every > 0;
    }

    /**
     * Inputs between two snapshots while the health view knows {@code signals} signals: the
     * fixed interval, or {@code PER_SIGNAL x signals} held within {@link #FLOOR} and {@link #CAP}.
     * 0 when snapshots are off.
     */
    public long intervalFor(int signals) {
        if (!followsState) return every;
        return Math.min(CAP, Math.max(FLOOR, (long) PER_SIGNAL * signals));
    }

    /**
     * True when a snapshot is due after {@code inputs} inputs since the last one, while the
     * health view knows {@code signals} signals; never when snapshots are off.
     */
    public boolean isDue(long inputs, int signals) {
        return isEnabled() && inputs >= intervalFor(signals);
    }

    @Override
    public String toString() {
        return followsState ? "scaled (" + PER_SIGNAL + " inputs a signal, " + FLOOR + " to " + CAP + ")"
                : every == 0 ? "never" : "every " + every + " inputs";
    }
}
