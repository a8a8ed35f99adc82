package dev.tend.shared.fleet;

import dev.tend.shared.SignalState;

import java.time.Instant;

/**
 * Where one signal of the {@link FleetHealthView} stands, mutable, so that an event costs one
 * lookup and no allocation: its state, since when, the latest event's time, and its last
 * {@code limit} state changes (event times, oldest first) in a ring that grows as needed. Times
 * that every event compares (the latest event's, the ring's) are kept as numbers in the slot
 * itself rather than as {@link Instant}s elsewhere in memory: each event reads one object, not
 * three or more. Not thread-safe.
 */
final class SignalSlot {
    private final int limit;
    SignalState state;
    Instant since;
    private Instant lastAt;
    /** {@link #lastAt} as seconds and nanoseconds of the epoch, for {@link #isBeforeLast}. */
    private long lastSecond;
    private int lastNano;
    /** The version of the view's topology {@link #inTopology} was answered for; -1: never asked. */
    long checkedVersion = -1;
    boolean inTopology;
    private long[] ringSeconds;
    private int[] ringNanos;
    private int head;
    private int count;
    /** The slot's key in the view, and its number in the order the view met it ({@link SignalMemos}). */
    dev.tend.shared.SignalKey key;
    int number;
    /** An event reached the slot since the last snapshot took it ({@link SignalMemos#touched}). */
    boolean touched;

    SignalSlot(int limit) {
        this.limit = limit;
    }

    SignalStatus status() {
        return new SignalStatus(state, since, lastAt);
    }

    boolean isProblem() {
        return state.isProblem();
    }

    Instant lastAt() {
        return lastAt;
    }

    void lastAt(Instant at) {
        lastAt = at;
        lastSecond = at == null ? Long.MIN_VALUE : at.getEpochSecond();
        lastNano = at == null ? 0 : at.getNano();
    }

    /** True when {@code at} is before the latest event's time: {@code at.isBefore(lastAt())}. */
    boolean isBeforeLast(Instant at) {
        long s = at.getEpochSecond();
        return s < lastSecond || s == lastSecond && at.getNano() < lastNano;
    }

    /** Remembers a state change at {@code at}, forgetting the oldest beyond the limit. */
    void changed(Instant at) {
        if (ringSeconds == null) {
            ringSeconds = new long[4];
            ringNanos = new int[4];
        }
        int size = ringSeconds.length;
        if (count == size && count < limit) {
            int bigger = Math.min(limit, size * 2);
            long[] seconds = new long[bigger];
            int[] nanos = new int[bigger];
            for (int i = 0; i < count; i++) {
                seconds[i] = ringSeconds[(head + i) % size];
                nanos[i] = ringNanos[(head + i) % size];
            }
            ringSeconds = seconds;
            ringNanos = nanos;
            head = 0;
            size = bigger;
        }
        int at0;
        if (count < size) {
            at0 = (head + count) % size;
            count++;
        } else {
            at0 = head;
            head = (head + 1) % size;
        }
        ringSeconds[at0] = at.getEpochSecond();
        ringNanos[at0] = at.getNano();
    }

    /** How many of the remembered changes were at or after {@code from}. */
    int changesSince(Instant from) {
        long fs = from.getEpochSecond();
        int fn = from.getNano();
        int n = 0;
        for (int i = 0; i < count; i++) {
            int j = (head + i) % ringSeconds.length;
            long s = ringSeconds[j];
            if (s > fs || s == fs && ringNanos[j] >= fn) n++;
        }
        return n;
    }

    /** This slot as a snapshot's signal, its recent changes copied as numbers. */
    HealthMemo.Signal memo() {
        long[] seconds = new long[count];
        int[] nanos = new int[count];
        for (int i = 0; i < count; i++) {
            int j = (head + i) % ringSeconds.length;
            seconds[i] = ringSeconds[j];
            nanos[i] = ringNanos[j];
        }
        return new HealthMemo.Signal(key, state, since, lastAt, new InstantList(seconds, nanos));
    }
}
