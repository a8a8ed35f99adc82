package dev.tend.shared;

import java.util.HashMap;
import java.util.Map;

/**
 * Makes the ids of the events one reader reads canonical: one {@link Id} instance per distinct
 * id, so that the engine's maps, which hold the same instances, compare them by identity before
 * they compare characters. Used by replay's reader and by {@code tend ingest}'s.
 *
 * <p>Not thread-safe: one reader, one thread. Holds one entry per distinct id read.
 */
public final class CanonicalEvents {
    private final Map<String, Id> ids = new HashMap<>(1 << 12);

    /** Makes {@code id} the instance later events with its value are given. */
    public void know(Id id) {
        ids.putIfAbsent(id.value(), id);
    }

    /**
     * {@code event} with each of its ids replaced by the canonical instance of its value:
     * {@code event} itself when its ids are those instances already (as a reader that looks ids
     * up by their bytes hands them on).
     */
    public WireEvent of(WireEvent event) {
        if (event instanceof HealthTransition t) {
            Id cluster = id(t.cluster());
            Id node = id(t.node());
            Id signal = id(t.signal());
            if (cluster == t.cluster() && node == t.node() && signal == t.signal()) return t;
            return new HealthTransition(t.at(), cluster, node, signal, t.state(), t.detail(), t.extra());
        }
        TopologyEvent o = (TopologyEvent) event;
        return new TopologyEvent(o.at(), id(o.cluster()), id(o.node()), o.change(), o.attrs(), o.extra());
    }

    /**
     * The canonical instance of the id {@code value}, made the canonical one when new: what a
     * reader given it ({@link dev.tend.shared.wire.WireReader#withIds}) hands on, so that its
     * events need no {@link #of}.
     *
     * @throws IllegalArgumentException when {@code value} is not a valid id
     */
    public Id canonical(String value) {
        return ids.computeIfAbsent(value, Id::of);
    }

    private Id id(Id id) {
        if (id == null) return null;
        Id known = ids.get(id.value());
        if (known != null) return known;
        ids.put(id.value(), id);
        return id;
    }
}
