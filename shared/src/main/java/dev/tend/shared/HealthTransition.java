package dev.tend.shared;

import java.time.Instant;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * "Signal S on node N of cluster C went to breach / silent / clear at event time T."
 *
 * @param at      event time, not null
 * @param cluster the cluster, not null
 * @param node    the node, or null for a cluster-level signal
 * @param signal  the signal, not null
 * @param state   the new state, not null
 * @param detail  the free-form {@code detail} object, unmodifiable, never null
 * @param extra   unknown fields of the wire line, kept and ignored, unmodifiable, never null; never
 *                holds a name the wire format gives a meaning on a transition's line (see {@link #WIRE_FIELDS})
 */
public record HealthTransition(Instant at, Id cluster, Id node, Id signal, SignalState state,
                               Map<String, Object> detail, Map<String, Object> extra) implements WireEvent {
    /** Names with a meaning on a transition's wire line: its fields, and the keys that mark other kinds of line. */
    public static final Set<String> WIRE_FIELDS =
            Set.of("at", "cluster", "node", "signal", "state", "detail", "topology", "recording");

    public HealthTransition {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(signal, "signal");
        Objects.requireNonNull(state, "state");
        detail = detail == null ? Map.of() : JsonValues.freeze(detail);
        extra = extra == null ? Map.of() : JsonValues.freeze(extra);
        if (!extra.isEmpty()) checkExtra(extra);
    }

    private static void checkExtra(Map<String, Object> extra) {
        for (String key : extra.keySet()) {
            if (WIRE_FIELDS.contains(key)) {
                throw new IllegalArgumentException("extra must not hold '" + key + "': wire format v1 gives it a meaning");
            }
        }
    }

    public static HealthTransition of(Instant at, String cluster, String node, String signal, SignalState state) {
        return new HealthTransition(at, Id.of(cluster), node == null ? null : Id.of(node), Id.of(signal), state,
                Map.of(), Map.of());
    }

    /** True when the signal is reported for the whole cluster rather than one node. */
    public boolean isClusterLevel() {
        return node == null;
    }

    /** The (cluster, node, signal) key under which events are ordered. */
    public SignalKey key() {
        return new SignalKey(cluster, node, signal);
    }
}
