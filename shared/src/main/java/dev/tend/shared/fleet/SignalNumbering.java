package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;

import java.util.HashMap;
import java.util.Map;

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
    private final Map<SignalKey, Numbered> numbers = new HashMap<>(1 << 12);

    /** The numbered key of (cluster, node, signal), node null for a cluster-level signal; numbered now when new. */
    public Numbered of(Id cluster, Id node, Id signal) {
        SignalKey key = new SignalKey(cluster, node, signal);
        Numbered n = numbers.get(key);
        if (n == null) {
            n = new Numbered(this, key, numbers.size());
            numbers.put(key, n);
        }
        return n;
    }

    /** How many distinct signals are numbered. */
    public int size() {
        return numbers.size();
    }

    /** A signal's key with its number in one {@link SignalNumbering}; one instance per signal and numbering. */
    public static final class Numbered {
        private final SignalNumbering numbering;
        private final SignalKey key;
        private final int number;

        private Numbered(SignalNumbering numbering, SignalKey key, int number) {
            this.numbering = numbering;
            this.key = key;
            this.number = number;
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
