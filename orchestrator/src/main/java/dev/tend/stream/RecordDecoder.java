package dev.tend.stream;

import dev.tend.engine.Input;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.TimeRefusal;
import dev.tend.shared.wire.WireReader;
import dev.tend.runtime.StreamPosition;

import java.time.Duration;
import java.time.Instant;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;

/**
 * Reads one record's value as one line of wire format v1, with the checks of every live
 * input (time bounds, clock skew, declared signals): the reader the HTTP route and
 * {@code tend ingest} use. Free of the Kafka client, so its rules are tested on their own.
 */
final class RecordDecoder {
    private final Supplier<Instant> clock;
    private final Duration maxSkew;
    private final List<Id> signals;

    RecordDecoder(Supplier<Instant> clock, Duration maxSkew, Collection<Id> signals) {
        this.clock = clock;
        this.maxSkew = maxSkew;
        this.signals = List.copyOf(signals);
    }

    /**
     * What one record holds: an event for the engine, or why it is refused.
     *
     * @param input       the event, or null when refused
     * @param reason      why it is refused (naming the field, if one is at fault), or null
     * @param timeRefusal the time rule it broke, or null
     */
    record Decoded(Input input, String reason, TimeRefusal timeRefusal) {
    }

    /** Decodes the value of the record at {@code at}; {@code value} null is a record without a value. */
    Decoded decode(String value, StreamPosition at) {
        if (value == null) return refused("the record has no value (a deletion marker); it should hold one wire line");
        WireReader wire = WireReader.of(at.describe()).withLiveClock(clock, maxSkew).withSignals(signals);
        LineResult r = wire.parseLine(value.strip(), 1);
        if (r instanceof LineResult.Event e) {
            return new Decoded(e.event() instanceof HealthTransition t ? new Input.Transition(t)
                    : new Input.Topology((TopologyEvent) e.event()), null, null);
        }
        if (r instanceof LineResult.Bad b) {
            TimeRefusal broke = null;
            for (Map.Entry<TimeRefusal, Long> c : wire.timeRefusals().entrySet()) if (c.getValue() > 0) broke = c.getKey();
            return new Decoded(null, reason(b.problem()), broke);
        }
        if (r instanceof LineResult.Header) {
            return refused("the record is a recording header, which belongs at the top of a recording file, not in a topic");
        }
        return refused("the record is empty; it should hold one wire line");
    }

    private static Decoded refused(String reason) {
        return new Decoded(null, reason, null);
    }

    private static String reason(Problem p) {
        StringBuilder sb = new StringBuilder();
        if (!p.field().isEmpty()) sb.append("field '").append(p.field()).append("'");
        if (p.column() > 0) sb.append(sb.length() > 0 ? " at column " : "column ").append(p.column());
        if (sb.length() > 0) sb.append(": ");
        return sb.append(p.message()).toString();
    }
}
