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

    /**
     * Writes {@code sec[.fraction]} into {@code out} (sec at least 0); returns its length. Two
     * digits a division, in ints while the seconds fit one (until 2038): under C1, which
     * {@code tend ingest} runs, each division is a division, and a snapshot writes 400,000 instants.
     */
    static int seconds(long sec, int nano, char[] out) {
        int digits = 1;
        while (digits < 19 && sec >= POW10[digits]) digits++;
        if (sec <= Integer.MAX_VALUE) {
            putInt((int) sec, out, 0, digits);
        } else {
            long v = sec;
            for (int i = digits - 1; i >= 0; i--) {
                long q = v / 10;
                out[i] = (char) ('0' + (int) (v - q * 10));
                v = q;
            }
        }
        int n = digits;
        if (nano != 0) {
            int f, fd;
            if (nano % 1_000_000 == 0) {
                f = nano / 1_000_000;
                fd = 3;
            } else if (nano % 1_000 == 0) {
                f = nano / 1_000;
                fd = 6;
            } else {
                f = nano;
                fd = 9;
            }
            while (f % 10 == 0) {
                f /= 10;
                fd--;
            }
            out[n++] = '.';
            putInt(f, out, n, n + fd); // the fraction's zeros in front included
            n += fd;
        }
        return n;
    }

    /** Writes {@code v} into {@code out[start, end)}, right-aligned, zeros in front; two digits a division. */
    private static void putInt(int v, char[] out, int start, int end) {
        int i = end;
        while (i - start >= 2) {
            int q = v / 100;
            int r = v - q * 100;
            out[--i] = ONES[r];
            out[--i] = TENS[r];
            v = q;
        }
        if (i > start) out[--i] = (char) ('0' + v % 10);
    }

    private static final long[] POW10 = new long[19];
    private static final char[] TENS = new char[100];
    private static final char[] ONES = new char[100];

    static {
        POW10[0] = 1;
        for (int i = 1; i < POW10.length; i++) POW10[i] = POW10[i - 1] * 10;
        for (int i = 0; i < 100; i++) {
            TENS[i] = (char) ('0' + i / 10);
            ONES[i] = (char) ('0' + i % 10);
        }
    }
}
