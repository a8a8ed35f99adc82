package dev.tend.shared.fleet;

import dev.tend.shared.SignalState;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * Where one signal of the {@link FleetHealthView} stands, mutable, so that an event costs one
 * map lookup and no allocation: its state, since when, the latest event's time, and its last
 * {@code limit} state changes (event times, oldest first) in a ring that grows as needed. Not
 * thread-safe.
 */
final class SignalSlot {
    private final int limit;
    SignalState state;
    Instant since;
    Instant lastAt;
    /** The version of the view's topology {@link #inTopology} was answered for; -1: never asked. */
    long checkedVersion = -1;
    boolean inTopology;
    private Instant[] ring;
    private int head;
    private int count;

    SignalSlot(int limit) {
        this.limit = limit;
    }

    SignalStatus status() {
        return new SignalStatus(state, since, lastAt);
    }

    boolean isProblem() {
        return state.isProblem();
    }

    /** Remembers a state change at {@code at}, forgetting the oldest beyond the limit. */
    void changed(Instant at) {
        if (ring == null) ring = new Instant[4];
        if (count == ring.length && count < limit) {
            Instant[] bigger = new Instant[Math.min(limit, ring.length * 2)];
            for (int i = 0; i < count; i++) bigger[i] = ring[(head + i) % ring.length];
            ring = bigger;
            head = 0;
        }
        if (count < ring.length) {
            ring[(head + count) % ring.length] = at;
            count++;
        } else {
            ring[head] = at;
            head = (head + 1) % ring.length;
        }
    }

    /** How many of the remembered changes were at or after {@code from}. */
    int changesSince(Instant from) {
        int n = 0;
        for (int i = 0; i < count; i++) if (!ring[(head + i) % ring.length].isBefore(from)) n++;
        return n;
    }

    /** The remembered changes, oldest first. */
    List<Instant> changes() {
        List<Instant> out = new ArrayList<>(count);
        for (int i = 0; i < count; i++) out.add(ring[(head + i) % ring.length]);
        return out;
    }
}
