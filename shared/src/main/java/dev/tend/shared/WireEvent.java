package dev.tend.shared;

import java.time.Instant;

/** One line of wire format v1: a health transition or a topology event. */
public sealed interface WireEvent permits HealthTransition, TopologyEvent {
    /** Event time (when it happened at the source), never null. */
    Instant at();

    Id cluster();

    /** The node, or null for a cluster-level event. */
    Id node();
}
