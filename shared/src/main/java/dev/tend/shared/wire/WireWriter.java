package dev.tend.shared.wire;

import com.fasterxml.jackson.core.JsonGenerator;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import dev.tend.shared.time.InstantText;

import java.io.Flushable;
import java.io.IOException;
import java.io.StringWriter;
import java.io.Writer;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * Writes wire format v1: one JSON object per line, ended by {@code \n}. Fields come in a
 * fixed order, so that equal events give equal lines:
 * <ul>
 *   <li>health transition: {@code at, cluster, node, signal, state, detail}, then the extra
 *       fields in their map order; {@code node} is left out for a cluster-level signal and
 *       {@code detail} when it is empty;</li>
 *   <li>topology event: {@code at, cluster, node, topology, attrs}, then extra fields;
 *       {@code attrs} is left out when empty;</li>
 *   <li>recording header: {@code recording, fleet, from, until, description}, then extra
 *       fields; absent ones are left out.</li>
 * </ul>
 * Times are RFC 3339 in UTC with {@code Z} ({@link Rfc3339#format}). {@link WireReader}
 * reads back an equal event from every line written here; numbers come back as Integer,
 * Long, BigInteger or Double, the types the reader produces.
 *
 * <p>Not thread-safe; the caller owns and closes the {@link Writer}.
 */
public final class WireWriter implements Flushable {
    private final Writer out;

    private WireWriter(Writer out) {
        this.out = Objects.requireNonNull(out, "out");
    }

    /** A writer appending lines to {@code out}. */
    public static WireWriter to(Writer out) {
        return new WireWriter(out);
    }

    /**
     * Appends {@code event} as one line.
     *
     * @throws IllegalArgumentException when the event holds a number JSON cannot carry
     *         (NaN, an infinity) or a time outside the years 0000 to 9999
     * @throws WireWriteException when the underlying writer fails
     */
    public void write(WireEvent event) {
        append(line(event));
    }

    /** Appends {@code header} as one line; a header belongs before the first event. */
    public void writeHeader(RecordingHeader header) {
        append(line(header));
    }

    @Override
    public void flush() {
        try {
            out.flush();
        } catch (IOException e) {
            throw new WireWriteException("cannot flush the wire output", e);
        }
    }

    /** The line for {@code event}, without the line break. */
    public static String line(WireEvent event) {
        if (event instanceof HealthTransition t && t.detail().isEmpty() && t.extra().isEmpty()) return plain(t);
        return generated(event);
    }

    /**
     * Most transitions, written without a generator: every value of such a line is an id, a
     * state or a time, none of which holds a character JSON escapes, so the text is the
     * generator's (each line of {@code tend ingest} and {@code POST /api/v1/transitions} is
     * written once for the journal, on the reader's thread).
     */
    private static String plain(HealthTransition t) {
        char[] at = new char[InstantText.MAX];
        int atLength = Rfc3339.write(t.at(), at);
        StringBuilder sb = new StringBuilder(160);
        sb.append("{\"at\":\"").append(at, 0, atLength).append("\",\"cluster\":\"").append(t.cluster().value());
        if (t.node() != null) sb.append("\",\"node\":\"").append(t.node().value());
        sb.append("\",\"signal\":\"").append(t.signal().value()).append("\",\"state\":\"").append(t.state().wireName()).append("\"}");
        return sb.toString();
    }

    /** The line for {@code event} as the JSON generator writes it (every event can be written so). */
    static String generated(WireEvent event) {
        StringWriter sw = new StringWriter(160);
        try (JsonGenerator g = WireJson.FACTORY.createGenerator(sw)) {
            g.writeStartObject();
            g.writeStringField("at", Rfc3339.format(event.at()));
            g.writeStringField("cluster", event.cluster().value());
            if (event.node() != null) g.writeStringField("node", event.node().value());
            Map<String, Object> extra;
            if (event instanceof HealthTransition t) {
                g.writeStringField("signal", t.signal().value());
                g.writeStringField("state", t.state().wireName());
                if (!t.detail().isEmpty()) {
                    g.writeFieldName("detail");
                    value(g, t.detail(), "detail");
                }
                extra = t.extra();
            } else {
                TopologyEvent e = (TopologyEvent) event;
                g.writeStringField("topology", e.change().wireName());
                if (!e.attrs().isEmpty()) {
                    g.writeFieldName("attrs");
                    value(g, e.attrs(), "attrs");
                }
                extra = e.extra();
            }
            fields(g, extra);
            g.writeEndObject();
        } catch (IOException e) {
            throw new WireWriteException("cannot write a wire line", e);
        }
        return sw.toString();
    }

    /** The line for {@code header}, without the line break. */
    public static String line(RecordingHeader header) {
        StringWriter sw = new StringWriter(160);
        try (JsonGenerator g = WireJson.FACTORY.createGenerator(sw)) {
            g.writeStartObject();
            g.writeStringField("recording", header.name());
            if (header.fleet() != null) g.writeStringField("fleet", header.fleet());
            if (header.inlineFleet() != null) {
                g.writeFieldName("fleet");
                value(g, header.inlineFleet(), "fleet");
            }
            if (header.from() != null) g.writeStringField("from", Rfc3339.format(header.from()));
            if (header.until() != null) g.writeStringField("until", Rfc3339.format(header.until()));
            if (header.description() != null) g.writeStringField("description", header.description());
            fields(g, header.extra());
            g.writeEndObject();
        } catch (IOException e) {
            throw new WireWriteException("cannot write a wire line", e);
        }
        return sw.toString();
    }

    private void append(String line) {
        try {
            out.write(line);
            out.write('\n');
        } catch (IOException e) {
            throw new WireWriteException("cannot write the wire output", e);
        }
    }

    private static void fields(JsonGenerator g, Map<String, Object> extra) throws IOException {
        for (Map.Entry<String, Object> e : extra.entrySet()) {
            g.writeFieldName(e.getKey());
            value(g, e.getValue(), e.getKey());
        }
    }

    private static void value(JsonGenerator g, Object v, String field) throws IOException {
        if (v == null) {
            g.writeNull();
        } else if (v instanceof String s) {
            g.writeString(s);
        } else if (v instanceof Boolean b) {
            g.writeBoolean(b);
        } else if (v instanceof Integer || v instanceof Long || v instanceof Short || v instanceof Byte) {
            g.writeNumber(((Number) v).longValue());
        } else if (v instanceof BigInteger b) {
            if (Double.isInfinite(b.doubleValue())) {
                throw new IllegalArgumentException("field '" + field + "' holds a number too large for a 64-bit float");
            }
            g.writeNumber(b);
        } else if (v instanceof BigDecimal b) {
            if (Double.isInfinite(b.doubleValue())) {
                throw new IllegalArgumentException("field '" + field + "' holds " + b + ", too large for a 64-bit float");
            }
            g.writeNumber(b);
        } else if (v instanceof Number n) {
            double d = n.doubleValue();
            if (Double.isNaN(d) || Double.isInfinite(d)) {
                throw new IllegalArgumentException("field '" + field + "' holds " + d + ", which is not a JSON number");
            }
            g.writeNumber(d);
        } else if (v instanceof Map<?, ?> m) {
            g.writeStartObject();
            for (Map.Entry<?, ?> e : m.entrySet()) {
                g.writeFieldName((String) e.getKey());
                value(g, e.getValue(), field);
            }
            g.writeEndObject();
        } else if (v instanceof List<?> l) {
            g.writeStartArray();
            for (Object o : l) value(g, o, field);
            g.writeEndArray();
        } else {
            throw new IllegalArgumentException("field '" + field + "' holds a " + v.getClass().getName() + ", not a JSON value");
        }
    }
}
