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

    @Override
    public String toString() {
        return cluster + "/" + (node == null ? "-" : node.value()) + "/" + signal;
    }
}
