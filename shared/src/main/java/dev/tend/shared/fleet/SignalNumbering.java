package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;


/**
 * Numbers the distinct signals a reader meets 0, 1, 2, ... in the order it first meets them,
 * each with one {@link SignalKey} instance: a {@link FleetHealthView} handed a {@link Numbered}
 * key finds the signal's slot in an array by its number, instead of hashing the key into its
 * map and comparing it there (a lookup bound by memory, once per event). The reader pays the
 * hashing instead, on its own thread.
 *
 * <p>Not thread-safe: one reader numbers on one thread. The numbered keys, which never change,
 * may be handed to other threads through a safe hand-over (a blocking queue).
 */
public final class SignalNumbering {
    /**
     * The numbered keys by their key's hash, open addressing with linear probing, at most half
     * full: a key already numbered is found without a {@link SignalKey} made for the lookup, and
     * compared by the identity of its ids first (a reader's ids are canonical).
     */
    private Numbered[] table = new Numbered[1 << 12];
    private int size;

    /** The numbered key of (cluster, node, signal), node null for a cluster-level signal; numbered now when new. */
    public Numbered of(Id cluster, Id node, Id signal) {
        // SignalKey's hash, spread, so that equal keys meet whichever instances their ids are
        int h = (31 * cluster.hashCode() + (node == null ? 0 : node.hashCode())) * 31 + signal.hashCode();
        h ^= h >>> 16;
        int mask = table.length - 1;
        for (int i = h & mask; ; i = (i + 1) & mask) {
            Numbered n = table[i];
            if (n == null) return add(i, h, new SignalKey(cluster, node, signal));
            if (n.hash == h && n.is(cluster, node, signal)) return n;
        }
    }

    /** How many distinct signals are numbered. */
    public int size() {
        return size;
    }

    private Numbered add(int slot, int h, SignalKey key) {
        Numbered n = new Numbered(this, key, size, h);
        table[slot] = n;
        size++;
        if (size * 2 > table.length) {
            Numbered[] old = table;
            table = new Numbered[old.length * 2];
            int mask = table.length - 1;
            for (Numbered o : old) {
                if (o == null) continue;
                int i = o.hash & mask;
                while (table[i] != null) i = (i + 1) & mask;
                table[i] = o;
            }
        }
        return n;
    }

    /** A signal's key with its number in one {@link SignalNumbering}; one instance per signal and numbering. */
    public static final class Numbered {
        private final SignalNumbering numbering;
        private final SignalKey key;
        private final int number;
        private final int hash;

        private Numbered(SignalNumbering numbering, SignalKey key, int number, int hash) {
            this.numbering = numbering;
            this.key = key;
            this.number = number;
            this.hash = hash;
        }

        private boolean is(Id cluster, Id node, Id signal) {
            return (key.cluster() == cluster || key.cluster().equals(cluster))
                    && (key.node() == node || node != null && node.equals(key.node()))
                    && (key.signal() == signal || key.signal().equals(signal));
        }

        public SignalKey key() {
            return key;
        }

        public int number() {
            return number;
        }

        SignalNumbering numbering() {
            return numbering;
        }

        @Override
        public String toString() {
            return key + " #" + number;
        }
    }
}
