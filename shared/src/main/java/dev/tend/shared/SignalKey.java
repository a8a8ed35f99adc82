package dev.tend.shared;

import java.util.Objects;

/**
 * Where a signal lives: (cluster, node, signal); node is null for a cluster-level signal.
 * Events are ordered by event time per key.
 */
public record SignalKey(Id cluster, Id node, Id signal) {
    public SignalKey {
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(signal, "signal");
    }

    // written out rather than generated: every event looks its key up in several maps
    @Override
    public boolean equals(Object o) {
        if (this == o) return true;
        if (!(o instanceof SignalKey k)) return false;
        return cluster.equals(k.cluster) && java.util.Objects.equals(node, k.node) && signal.equals(k.signal);
    }

    @Override
    public int hashCode() {
        return (31 * cluster.hashCode() + (node == null ? 0 : node.hashCode())) * 31 + signal.hashCode();
    }

    @Override
    public String toString() {
        return cluster + "/" + (node == null ? "-" : node.value()) + "/" + signal;
    }
}
