package dev.tend.api.view;

import java.time.Instant;
import java.util.List;

/**
 * The fleet's health as the engine sees it, published whole after each change.
 *
 * @param at                 processing time of the picture
 * @param eventTime          the engine's event time; null before the first event
 * @param clusters           clusters in the topology
 * @param unhealthy          clusters with any signal in breach or silent
 * @param unhealthyClusters  those clusters, by id
 * @param zones              every zone of the topology, by name
 * @param timeScale          how many times faster than the wall clock processing time runs: 1 live,
 *                           more in {@code tend demo} (a console labels such time as accelerated)
 */
public record FleetHealth(Instant at, Instant eventTime, String fleet, int clusters, int unhealthy,
                          double unhealthyFraction, int activeRuns, BrakeView brake, List<Zone> zones,
                          List<ClusterProblem> unhealthyClusters, double timeScale) {
    public FleetHealth {
        zones = List.copyOf(zones);
        unhealthyClusters = List.copyOf(unhealthyClusters);
    }

    /** Before the engine was recovered. */
    public static FleetHealth empty() {
        return new FleetHealth(null, null, null, 0, 0, 0, 0, BrakeView.released(), List.of(), List.of(), 1);
    }

    /** A copy with other run and brake figures, the health itself unchanged. */
    public FleetHealth withRuns(Instant newAt, int newActiveRuns, BrakeView newBrake) {
        return new FleetHealth(newAt, eventTime, fleet, clusters, unhealthy, unhealthyFraction, newActiveRuns, newBrake,
                zones, unhealthyClusters, timeScale);
    }

    /**
     * One zone: its own nodes, how many clusters have a node there, which of those are unhealthy
     * (a cluster-level problem counts in every zone of the cluster), and how many of its nodes
     * have a signal in breach or silent.
     */
    public record Zone(String zone, int nodes, int clusters, List<String> unhealthy, int impairedNodes) {
        public Zone {
            unhealthy = List.copyOf(unhealthy);
        }
    }

    /**
     * An unhealthy cluster.
     *
     * @param health impaired (fewer impaired nodes than it tolerates), unhealthy, or unknown-target
     *               (the cluster is not in the topology: shown, never remediated)
     * @param zones  the zones its problems are in
     */
    public record ClusterProblem(String cluster, String health, List<String> zones, List<Signal> signals) {
        public ClusterProblem {
            zones = List.copyOf(zones);
            signals = List.copyOf(signals);
        }
    }

    /**
     * A signal in breach or silent; node null for a cluster-level signal.
     *
     * @param unknownTarget its cluster or node is not in the topology: shown, never remediated
     */
    public record Signal(String node, String signal, String state, Instant since, boolean unknownTarget) {
    }
}
