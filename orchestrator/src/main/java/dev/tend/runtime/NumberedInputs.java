package dev.tend.runtime;

import dev.tend.engine.Input;
import dev.tend.shared.CanonicalEvents;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.SignalNumbering;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.WireReader;
import dev.tend.shared.wire.WireWriter;

/**
 * Turns the events one reader reads into the engine's inputs as replay's reader does: ids made
 * canonical ({@link CanonicalEvents}, so the engine's maps compare them by identity), each
 * transition's signal numbered ({@link SignalNumbering}, so the health view finds its slot by
 * number instead of hashing the key into a map of every signal the fleet has), and its wire line
 * written, all on the reader's thread rather than the driver's.
 *
 * <p>Not thread-safe: one reader, one thread. Holds one entry per distinct id and signal read,
 * as the health view does.
 */
public final class NumberedInputs {
    private final CanonicalEvents events = new CanonicalEvents();
    private final SignalNumbering numbering = new SignalNumbering();

    /** The input of {@code event}: a numbered transition with its wire line, or a topology change. */
    public Input of(WireEvent event) {
        return of(event, null);
    }

    /** The input of the event {@code read}; its wire line is the one the reader had at hand, when it had one. */
    public Input of(LineResult.Event read) {
        return of(read.event(), read.wire());
    }

    /**
     * {@code wire} handing on this instance's canonical ids ({@link WireReader#withIds}): the
     * events it reads are taken by {@link #ofCanonical}, with no lookup of their ids.
     */
    public WireReader canonicalIds(WireReader wire) {
        return wire.withIds(events);
    }

    /** The input of the event {@code read} by a reader from {@link #canonicalIds}: its ids are the canonical instances already. */
    public Input ofCanonical(LineResult.Event read) {
        return of(read.event(), read.wire(), false);
    }

    private Input of(WireEvent event, String wire) {
        return of(event, wire, true);
    }

    private Input of(WireEvent event, String wire, boolean lookUpIds) {
        WireEvent e = lookUpIds ? events.of(event) : event;
        if (e instanceof HealthTransition c) {
            return new Input.Transition(c, wire != null ? wire : WireWriter.line(c), numbering.of(c.cluster(), c.node(), c.signal()));
        }
        return new Input.Topology((TopologyEvent) e);
    }
}
