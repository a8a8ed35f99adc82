package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.DeserializationContext;
import com.fasterxml.jackson.databind.JsonDeserializer;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.HealthMemo;

import java.io.IOException;
import java.math.BigDecimal;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * Reads one signal of a format-2 snapshot, as {@link SignalMemoWriter} writes it. The
 * mapper must read floating-point numbers as {@link BigDecimal} (a double would round away
 * the nanoseconds); throws {@link IOException} naming what is wrong for anything else.
 */
final class SignalMemoReader extends JsonDeserializer<HealthMemo.Signal> {
    private static final BigDecimal NANOS = BigDecimal.valueOf(1_000_000_000L);

    @Override
    public HealthMemo.Signal deserialize(JsonParser p, DeserializationContext c) throws IOException {
        expect(p, p.currentToken(), JsonToken.START_ARRAY, "a signal");
        Id cluster = id(p);
        Id node = id(p);
        Id signal = id(p);
        JsonToken t = p.nextToken();
        SignalState state = t == JsonToken.VALUE_NULL ? null : SignalState.valueOf(text(p, t, "a signal's state"));
        Instant since = instant(p, p.nextToken());
        Instant lastAt = instant(p, p.nextToken());
        expect(p, p.nextToken(), JsonToken.START_ARRAY, "a signal's changes");
        List<Instant> changes = new ArrayList<>();
        for (JsonToken e = p.nextToken(); e != JsonToken.END_ARRAY; e = p.nextToken()) changes.add(instant(p, e));
        expect(p, p.nextToken(), JsonToken.END_ARRAY, "the end of a signal");
        return new HealthMemo.Signal(new SignalKey(cluster, node, signal), state, since, lastAt, changes);
    }

    private static Id id(JsonParser p) throws IOException {
        JsonToken t = p.nextToken();
        return t == JsonToken.VALUE_NULL ? null : Id.of(text(p, t, "a signal's id"));
    }

    /** A number of seconds since the epoch (to the nanosecond), RFC 3339 text, or null. */
    private static Instant instant(JsonParser p, JsonToken t) throws IOException {
        if (t == JsonToken.VALUE_NULL) return null;
        if (t == JsonToken.VALUE_STRING) return Instant.parse(p.getText());
        if (t == JsonToken.VALUE_NUMBER_INT) return Instant.ofEpochSecond(p.getLongValue());
        if (t == JsonToken.VALUE_NUMBER_FLOAT) {
            BigDecimal s = p.getDecimalValue();
            long sec = s.longValue();
            return Instant.ofEpochSecond(sec, s.subtract(BigDecimal.valueOf(sec)).multiply(NANOS).intValueExact());
        }
        throw new IOException("expected an instant in a signal, got " + t + " at " + p.currentLocation());
    }

    private static String text(JsonParser p, JsonToken t, String what) throws IOException {
        expect(p, t, JsonToken.VALUE_STRING, what);
        return p.getText();
    }

    private static void expect(JsonParser p, JsonToken t, JsonToken wanted, String what) throws IOException {
        if (t != wanted) throw new IOException("expected " + what + " (" + wanted + "), got " + t + " at " + p.currentLocation());
    }
}
