package dev.tend.simulator.synth;

import java.util.Arrays;

/**
 * Synthetic events held compactly (a week of a large fleet is a million of them) until they
 * are sorted by arrival and written. Times are whole seconds from the start; the arrival
 * adds a delay in milliseconds, so a few events arrive after later ones, as over a network.
 */
final class EventBuffer {
    static final byte BREACH = 0, SILENT = 1, CLEAR = 2, TOPOLOGY_CHANGED = 3;
    private static final int INDEX_BITS = 28;
    static final int MAX_EVENTS = 1 << INDEX_BITS;

    private final long limitSeconds;
    int size;
    int[] at = new int[1 << 16];
    long[] arrivalMs = new long[1 << 16];
    int[] cluster = new int[1 << 16];
    byte[] node = new byte[1 << 16];
    byte[] signal = new byte[1 << 16];
    byte[] state = new byte[1 << 16];

    EventBuffer(long limitSeconds) {
        this.limitSeconds = limitSeconds;
    }

    /** Adds an event unless it falls outside [0, limit); node -1 means cluster-level. */
    void add(long atSeconds, int delayMs, int clusterIndex, int nodeIndex, int signalIndex, byte st) {
        if (atSeconds < 0 || atSeconds >= limitSeconds) return;
        if (size == MAX_EVENTS) {
            throw new IllegalStateException("a synthetic recording holds at most " + MAX_EVENTS + " events; ask for fewer clusters or days");
        }
        if (size == at.length) grow();
        at[size] = (int) atSeconds;
        arrivalMs[size] = atSeconds * 1000 + delayMs;
        cluster[size] = clusterIndex;
        node[size] = (byte) nodeIndex;
        signal[size] = (byte) signalIndex;
        state[size] = st;
        size++;
    }

    private void grow() {
        int n = at.length * 2;
        at = Arrays.copyOf(at, n);
        arrivalMs = Arrays.copyOf(arrivalMs, n);
        cluster = Arrays.copyOf(cluster, n);
        node = Arrays.copyOf(node, n);
        signal = Arrays.copyOf(signal, n);
        state = Arrays.copyOf(state, n);
    }

    /** Indices in arrival order; ties keep the order they were added in. */
    int[] arrivalOrder() {
        long[] keys = new long[size];
        for (int i = 0; i < size; i++) keys[i] = arrivalMs[i] << INDEX_BITS | i;
        Arrays.sort(keys);
        int[] order = new int[size];
        long mask = (1L << INDEX_BITS) - 1;
        for (int i = 0; i < size; i++) order[i] = (int) (keys[i] & mask);
        return order;
    }
}
