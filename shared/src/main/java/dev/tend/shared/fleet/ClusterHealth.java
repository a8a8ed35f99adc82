package dev.tend.shared.fleet;

/** A cluster's derived health. */
public enum ClusterHealth {
    /** No signal of the cluster or its nodes is in breach or silent. */
    HEALTHY,
    /** Some nodes have problems, fewer than the cluster tolerates (quorum, healthy copies). */
    IMPAIRED,
    /** A cluster-level problem, or more impaired nodes than the cluster tolerates. */
    UNHEALTHY
}
