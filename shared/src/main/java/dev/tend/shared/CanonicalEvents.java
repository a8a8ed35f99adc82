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

    /** {@code event} with each of its ids replaced by the canonical instance of its value. */
    public WireEvent of(WireEvent event) {
        if (event instanceof HealthTransition t) {
            return new HealthTransition(t.at(), id(t.cluster()), id(t.node()), id(t.signal()), t.state(), t.detail(), t.extra());
        }
        TopologyEvent o = (TopologyEvent) event;
        return new TopologyEvent(o.at(), id(o.cluster()), id(o.node()), o.change(), o.attrs(), o.extra());
    }

    private Id id(Id id) {
        if (id == null) return null;
        Id known = ids.putIfAbsent(id.value(), id);
        return known == null ? id : known;
    }
}
