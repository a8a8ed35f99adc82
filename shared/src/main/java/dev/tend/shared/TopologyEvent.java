package dev.tend.shared;

import java.time.Instant;
import java.util.Map;
import java.util.Objects;

/**
 * A node joined, left or changed (zone, tags).
 *
 * @param at     event time, not null
 * @param cluster the cluster, not null
 * @param node   the node, not null
 * @param change what happened
 * @param attrs  attributes such as {@code zone}; unmodifiable, never null
 * @param extra  unknown fields, kept and ignored
 */
public record TopologyEvent(Instant at, Id cluster, Id node, TopologyChange change,
                            Map<String, Object> attrs, Map<String, Object> extra) implements WireEvent {
    public TopologyEvent {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(node, "node");
        Objects.requireNonNull(change, "change");
        attrs = attrs == null ? Map.of() : JsonValues.freeze(attrs);
        extra = extra == null ? Map.of() : JsonValues.freeze(extra);
    }

    /** The {@code zone} attribute, or null when the event does not name one. */
    public String zone() {
        Object z = attrs.get("zone");
        return z == null ? null : z.toString();
    }
}
