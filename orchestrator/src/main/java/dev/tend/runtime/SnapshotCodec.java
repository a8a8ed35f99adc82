package dev.tend.runtime;

import com.fasterxml.jackson.annotation.JsonAutoDetect;
import com.fasterxml.jackson.annotation.PropertyAccessor;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.databind.DeserializationContext;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonDeserializer;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.JsonSerializer;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.SerializerProvider;
import com.fasterxml.jackson.databind.module.SimpleModule;
import com.fasterxml.jackson.datatype.jsr310.JavaTimeModule;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EngineState;
import dev.tend.shared.StepState;
import dev.tend.playbooks.Playbook;
import dev.tend.shared.Id;
import dev.tend.shared.time.InstantText;
import dev.tend.shared.TendException;
import dev.tend.shared.fleet.HealthMemo;
import dev.tend.shared.json.Sha256;
import dev.tend.store.SnapshotRow;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.time.Instant;
import java.util.Map;
import java.util.zip.GZIPInputStream;
import java.util.zip.GZIPOutputStream;

/**
 * Writes an {@link EngineState} as a snapshot row and reads it back, with how far the
 * driver had read each input file ({@code sources}, see {@link SourceProgress}). The body is
 * gzip-compressed JSON: {@code {"format":2,"seq":N,"sources":{...},"state":{...}}}, the state's records as
 * objects of their components, instants as RFC 3339 text with every digit of the fraction,
 * durations as ISO 8601, ids as strings; except the health view's signals, the bulk of it,
 * each an array with its instants as numbers of seconds ({@link SignalMemoWriter}).
 *
 * <p>{@value #FORMAT} is this tend's format; it reads format 1 too (the signals as objects of
 * their components with instants as text, as every other record). A snapshot of a newer format
 * is refused with {@link SnapshotFormatException}: a newer tend may keep state this one does
 * not know, and starting from part of it would be wrong. When the layout changes, raise
 * {@link #FORMAT} and keep reading the formats before it.
 */
public final class SnapshotCodec {
    /** The snapshot format this tend writes and reads. */
    public static final int FORMAT = 2;
    /**
     * The version of what {@link #fingerprint} hashes, apart from {@link #FORMAT}: a snapshot of
     * format 1 was taken under the same setup as one of format 2 and starts a store as well.
     */
    private static final int SETUP_PRINT = 1;

    /** Writes and reads format 2. */
    private static final ObjectMapper JSON = mapper();
    /** Reads format 1 (records as their components throughout), and gives {@link #json}'s text. */
    private static final ObjectMapper RECORDS = recordMapper(textModule());

    private SnapshotCodec() {
    }

    private static ObjectMapper mapper() {
        ObjectMapper m = recordMapper(textModule());
        // the health view's signals are most of a snapshot: written and read without reflection, in a form of their own
        m.registerModule(new SimpleModule("tend-signals").addSerializer(HealthMemo.Signal.class, new SignalMemoWriter())
                .addDeserializer(HealthMemo.Signal.class, new SignalMemoReader()));
        // a signal's instants are seconds with nine fraction digits: a double would round them
        m.enable(DeserializationFeature.USE_BIG_DECIMAL_FOR_FLOATS);
        return m;
    }

    /** Ids, step states and instants as text. */
    static SimpleModule textModule() {
        SimpleModule ids = new SimpleModule("tend-text");
        asText(ids, Id.class, Id::value, Id::of);
        // a step's state by its wire name, as snapshots held it while it was text
        asText(ids, StepState.class, StepState::wireName,
                wire -> StepState.of(wire).orElseThrow(() -> new IllegalArgumentException("not a step state: '" + wire + "'")));
        // Instant.toString()'s text (what the time module writes too), without its formatter: a snapshot holds many
        ids.addSerializer(Instant.class, new JsonSerializer<>() {
            @Override
            public void serialize(Instant t, JsonGenerator g, SerializerProvider p) throws IOException {
                g.writeString(InstantText.of(t));
            }
        });
        return ids;
    }

    /** Records as their components, with {@code text}: the mapping every snapshot's JSON follows. */
    static ObjectMapper recordMapper(SimpleModule text) {
        ObjectMapper m = new ObjectMapper();
        m.registerModule(new JavaTimeModule());
        m.registerModule(text);
        // Records as their components only: no derived getters (isCluster, isProblem, ...) in the file.
        m.setVisibility(PropertyAccessor.ALL, JsonAutoDetect.Visibility.NONE);
        m.setVisibility(PropertyAccessor.FIELD, JsonAutoDetect.Visibility.ANY);
        m.disable(SerializationFeature.WRITE_DATES_AS_TIMESTAMPS);
        m.disable(SerializationFeature.WRITE_DURATIONS_AS_TIMESTAMPS);
        // Maps made by Map.copyOf iterate in an order that changes from one JVM to the next.
        m.enable(SerializationFeature.ORDER_MAP_ENTRIES_BY_KEYS);
        m.enable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES);
        return m;
    }

    /** Writes a {@code type} as the text {@code write} gives, and reads it back with {@code read}. */
    private static <T> void asText(SimpleModule module, Class<T> type, java.util.function.Function<T, String> write,
                                   java.util.function.Function<String, T> read) {
        module.addSerializer(type, new JsonSerializer<T>() {
            @Override
            public void serialize(T value, JsonGenerator g, SerializerProvider p) throws IOException {
                g.writeString(write.apply(value));
            }
        });
        module.addDeserializer(type, new JsonDeserializer<T>() {
            @Override
            public T deserialize(JsonParser p, DeserializationContext c) throws IOException {
                return read.apply(p.getValueAsString());
            }
        });
    }

    /** What a snapshot holds: the engine's state, and the events done of each input file by its identity. */
    public record Decoded(EngineState state, Map<String, Long> sources) {
        public Decoded {
            sources = Map.copyOf(sources);
        }
    }

    /** The snapshot row of {@code state}, the engine's state after journal seq {@code seq}. */
    public static SnapshotRow encode(long seq, Instant takenAt, String setupFingerprint, EngineState state,
                                     Map<String, Long> sources) {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        // streamed: building the state as a tree first cost as much again as writing it
        try (OutputStream out = new FastGzip(bytes); JsonGenerator g = JSON.createGenerator(out)) {
            g.writeStartObject();
            g.writeNumberField("format", FORMAT);
            g.writeNumberField("seq", seq);
            g.writeObjectFieldStart("sources");
            for (Map.Entry<String, Long> e : new java.util.TreeMap<>(sources).entrySet()) g.writeNumberField(e.getKey(), e.getValue());
            g.writeEndObject();
            g.writeFieldName("state");
            JSON.writeValue(g, state);
            g.writeEndObject();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return new SnapshotRow(seq, takenAt, FORMAT, setupFingerprint, bytes.toByteArray());
    }

    /**
     * gzip at level 2 rather than the default 6: on a snapshot of 2,000 clusters (10 MB of
     * JSON) about 40 ms instead of 140 ms, for a body about a third larger (measured
     * 2026-12-03). Any gzip reader reads it.
     */
    private static final class FastGzip extends GZIPOutputStream {
        FastGzip(OutputStream out) throws IOException {
            super(out, 1 << 16);
            def.setLevel(2);
        }
    }

    /** {@code state} as the JSON text a format-1 snapshot holds (uncompressed): equal states give equal text. */
    static String json(EngineState state) {
        try {
            return RECORDS.writeValueAsString(state);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** What {@code row} holds; throws {@link SnapshotFormatException} for a format this tend does not read. */
    public static Decoded decode(SnapshotRow row) {
        if (row.format() > FORMAT) {
            throw new SnapshotFormatException("the snapshot at journal seq " + row.seq() + " is in format " + row.format()
                    + ", written by a newer tend; this tend reads formats up to " + FORMAT + " and will not start from part of a "
                    + "state it does not understand: run the newer tend on this store");
        }
        ObjectMapper reader = row.format() == 1 ? RECORDS : JSON;
        try (InputStream in = new GZIPInputStream(new ByteArrayInputStream(row.body()), 1 << 16)) {
            JsonNode root = reader.readTree(in);
            int format = root.path("format").asInt(-1);
            if (format != row.format()) {
                throw new SnapshotFormatException("the snapshot at journal seq " + row.seq() + " says format " + format
                        + " inside but " + row.format() + " in its row; the store was changed by hand");
            }
            Map<String, Long> sources = new java.util.LinkedHashMap<>();
            root.path("sources").fields().forEachRemaining(e -> sources.put(e.getKey(), e.getValue().asLong()));
            return new Decoded(reader.treeToValue(root.get("state"), EngineState.class), sources);
        } catch (IOException e) {
            throw new SnapshotFormatException("the snapshot at journal seq " + row.seq() + " cannot be read (" + e.getMessage()
                    + "); start from the journal instead by deleting the snapshots table's rows", e);
        }
    }

    /**
     * A fingerprint of what an engine is built from: every playbook's content hash, the
     * actions, the fleet-wide policy, the brake, the event-time mode and the starting
     * topology. A snapshot taken under another setup is not the state a full replay would
     * build under this one.
     */
    public static String fingerprint(EngineSetup setup) {
        StringBuilder sb = new StringBuilder("tend-setup/").append(SETUP_PRINT).append('\n');
        for (Playbook p : setup.playbooks().playbooks()) {
            sb.append(p.id()).append(' ').append(p.version()).append(' ').append(p.contentHash()).append('\n');
        }
        sb.append("actions ").append(setup.playbooks().actions().contentHash()).append('\n');
        sb.append("brake ").append(setup.brake()).append('\n');
        sb.append("event-time ").append(setup.eventTime()).append('\n');
        try {
            sb.append("config ").append(RECORDS.writeValueAsString(setup.config())).append('\n');
            sb.append("fleet ").append(RECORDS.writeValueAsString(setup.fleet().clusters()));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return Sha256.hexOf(sb.toString());
    }

    /** A snapshot this tend cannot start from. */
    public static final class SnapshotFormatException extends TendException {
        SnapshotFormatException(String message) {
            super(message);
        }

        SnapshotFormatException(String message, Throwable cause) {
            super(message, cause);
        }
    }
}
