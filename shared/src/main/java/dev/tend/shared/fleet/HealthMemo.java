package dev.tend.shared.fleet;

import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.List;

/**
 * A {@link FleetHealthView} as plain values, for a snapshot: every signal's latest state
 * and recent changes, when each node's topology last changed, the clusters whose topology
 * events changed them (their current shape, in fleet order) and the counters. Counts of
 * unhealthy clusters and impaired nodes are not kept: they follow from the signals.
 */
public record HealthMemo(List<Signal> signals, List<TopologyMark> topologyApplied, List<ClusterSpec> changedClusters,
                         long lateEvents, long appliedEvents) {
    public HealthMemo {
        signals = List.copyOf(signals);
        topologyApplied = List.copyOf(topologyApplied);
        changedClusters = List.copyOf(changedClusters);
    }

    /**
     * One signal: its state since {@code since}, last seen at {@code lastAt}, and its recent state
     * changes (an {@link InstantList} when taken from a view: it is unmodifiable already).
     */
    public record Signal(SignalKey key, SignalState state, Instant since, Instant lastAt, List<Instant> changes) {
        public Signal {
            changes = changes instanceof InstantList ? changes : List.copyOf(changes);
        }
    }

    public record TopologyMark(Target node, Instant at) {
    }
}
