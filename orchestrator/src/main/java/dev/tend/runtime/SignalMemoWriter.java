package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.JsonSerializer;
import com.fasterxml.jackson.databind.SerializerProvider;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.fleet.HealthMemo;
import dev.tend.shared.fleet.InstantList;
import dev.tend.shared.time.InstantText;

import java.io.IOException;
import java.time.Instant;

/**
 * Writes one signal of a snapshot's health view, the bulk of every snapshot (one per signal
 * of the fleet: 56,000 for 2,000 clusters, with about 400,000 instants), in snapshot format 2:
 * an array {@code [cluster, node, signal, state, since, lastAt, [changes...]]} (node, state,
 * since and lastAt may be null), each instant as its seconds since the epoch with the fraction
 * to the nanosecond and no trailing zeros ({@code 1773972656.4}), or as RFC 3339 text for an
 * instant before 1970. Half the bytes of format 1's objects of RFC 3339 text, so half the JSON
 * and half the compression to pay for. {@link SignalMemoReader} reads it back.
 */
final class SignalMemoWriter extends JsonSerializer<HealthMemo.Signal> {
    /** Digits of a long (19), the point and nine fraction digits, with room. */
    private static final int NUMBER_MAX = 32;

    @Override
    public void serialize(HealthMemo.Signal s, JsonGenerator g, SerializerProvider p) throws IOException {
        char[] text = new char[NUMBER_MAX];
        g.writeStartArray();
        SignalKey k = s.key();
        id(g, k.cluster());
        id(g, k.node());
        id(g, k.signal());
        if (s.state() == null) g.writeNull();
        else g.writeString(s.state().name());
        instant(g, s.since(), text);
        instant(g, s.lastAt(), text);
        g.writeStartArray();
        if (s.changes() instanceof InstantList list) {
            for (int i = 0; i < list.size(); i++) instant(g, list.epochSecond(i), list.nano(i), text);
        } else {
            for (Instant t : s.changes()) instant(g, t, text);
        }
        g.writeEndArray();
        g.writeEndArray();
    }

    private static void id(JsonGenerator g, Id id) throws IOException {
        if (id == null) g.writeNull();
        else g.writeString(id.value());
    }

    private static void instant(JsonGenerator g, Instant t, char[] text) throws IOException {
        if (t == null) g.writeNull();
        else instant(g, t.getEpochSecond(), t.getNano(), text);
    }

    /** The instant {@code sec}, {@code nano} as a number of seconds, or as text before 1970 (a number's sign would blur the fraction's). */
    static void instant(JsonGenerator g, long sec, int nano, char[] text) throws IOException {
        if (sec < 0) {
            g.writeString(InstantText.of(Instant.ofEpochSecond(sec, nano)));
            return;
        }
        g.writeNumber(text, 0, seconds(sec, nano, text));
    }

    /** Writes {@code sec[.fraction]} into {@code out} (sec at least 0); returns its length. */
    static int seconds(long sec, int nano, char[] out) {
        int n = 0;
        if (sec == 0) {
            out[n++] = '0';
        } else {
            int digits = 0;
            for (long v = sec; v > 0; v /= 10) digits++;
            for (int i = digits - 1; i >= 0; i--) {
                out[n + i] = (char) ('0' + (int) (sec % 10));
                sec /= 10;
            }
            n += digits;
        }
        if (nano != 0) {
            out[n++] = '.';
            int end = n + 9;
            for (int i = end - 1; i >= n; i--) {
                out[i] = (char) ('0' + nano % 10);
                nano /= 10;
            }
            while (out[end - 1] == '0') end--;
            n = end;
        }
        return n;
    }
}
