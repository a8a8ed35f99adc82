package dev.tend.shared;

import java.time.Instant;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * A node joined, left or changed (zone, tags).
 *
 * @param at     event time, not null
 * @param cluster the cluster, not null
 * @param node   the node, not null
 * @param change what happened
 * @param attrs  attributes such as {@code zone}; unmodifiable, never null
 * @param extra  unknown fields, kept and ignored; unmodifiable, never null; never holds a name
 *               the wire format gives a meaning on a topology event's line (see {@link #WIRE_FIELDS})
 */
public record TopologyEvent(Instant at, Id cluster, Id node, TopologyChange change,
                            Map<String, Object> attrs, Map<String, Object> extra) implements WireEvent {
    /** Names with a meaning on a topology event's wire line: its fields, and the keys that mark other kinds of line. */
    public static final Set<String> WIRE_FIELDS = Set.of("at", "cluster", "node", "topology", "attrs", "signal", "recording");

    public TopologyEvent {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(node, "node");
        Objects.requireNonNull(change, "change");
        attrs = attrs == null ? Map.of() : JsonValues.freeze(attrs);
        extra = extra == null ? Map.of() : JsonValues.freeze(extra);
        for (String key : extra.keySet()) {
            if (WIRE_FIELDS.contains(key)) {
                throw new IllegalArgumentException("extra must not hold '" + key + "': wire format v1 gives it a meaning");
            }
        }
    }

    /** The {@code zone} attribute, or null when the event does not name one. */
    public String zone() {
        Object z = attrs.get("zone");
        return z == null ? null : z.toString();
    }
}
