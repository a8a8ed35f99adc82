package dev.tend.runtime;

import dev.tend.engine.Input;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.SignalNumbering;
import dev.tend.shared.WireEvent;

import java.util.HashMap;
import java.util.Map;

/**
 * Turns the events one reader reads into the engine's inputs as replay's reader does: ids made
 * canonical (one instance per distinct id, so the engine's maps compare them by identity), each
 * transition's signal numbered ({@link SignalNumbering}, so the health view finds its slot by
 * number instead of hashing the key into a map of every signal the fleet has), and its wire line
 * written, all on the reader's thread rather than the driver's.
 *
 * <p>Not thread-safe: one reader, one thread. Holds one entry per distinct id and signal read,
 * as the health view does.
 */
public final class NumberedInputs {
    private final Map<String, Id> ids = new HashMap<>(1 << 12);
    private final SignalNumbering numbering = new SignalNumbering();

    /** The input of {@code event}: a numbered transition with its wire line, or a topology change. */
    public Input of(WireEvent event) {
        if (event instanceof HealthTransition t) {
            HealthTransition c = new HealthTransition(t.at(), id(t.cluster()), id(t.node()), id(t.signal()), t.state(),
                    t.detail(), t.extra());
            return new Input.Transition(c, dev.tend.shared.wire.WireWriter.line(c), numbering.of(c.cluster(), c.node(), c.signal()));
        }
        TopologyEvent o = (TopologyEvent) event;
        return new Input.Topology(new TopologyEvent(o.at(), id(o.cluster()), id(o.node()), o.change(), o.attrs(), o.extra()));
    }

    private Id id(Id id) {
        if (id == null) return null;
        Id known = ids.putIfAbsent(id.value(), id);
        return known == null ? id : known;
    }
}
