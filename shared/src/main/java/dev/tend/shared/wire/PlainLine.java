package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;

import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.Map;
import java.util.Set;

/**
 * The fast path of {@link WireReader#readAll(java.io.InputStream, java.util.function.Consumer)}
 * for the usual line, read from its UTF-8 bytes with no String made for the line or a repeated
 * id: a health transition in the plain form {@link WireWriter} writes,
 * {@code {"at":"2027-03-14T02:17:00.5Z","cluster":"fares-3","node":"n2","signal":"storage-full","state":"breach"}}
 * (these fields in this order, {@code node} optional, no whitespace, no escape, ASCII only, the time
 * in UTC with an upper-case {@code T} and {@code Z}, 0 to 9 fraction digits, a second of 00 to 59).
 * Ids are looked up by their bytes ({@link IdsByBytes}); the time is read from the bytes; the line
 * the journal keeps is the line's {@link CompactLine}: the line itself from the comma after the
 * cluster (its time, whose fraction's trailing zeros {@link Rfc3339#format} would drop, is written
 * again from the event's instant when the whole line is asked for).
 *
 * <p>Any other line, and a transition whose signal tend.yaml does not declare, makes it return
 * null; the line then goes the general way ({@link JsonLine}, {@link LineDecoder}), which alone
 * words every refusal. What it returns is exactly what the general way gives for the line:
 * {@code PlainLineTest} holds the two equal on generated lines. The reader's time checks follow
 * it. Not thread-safe: one per reading.
 */
final class PlainLine {
    private static final byte[] AT = ascii("{\"at\":\"");
    private static final byte[] CLUSTER = ascii("\",\"cluster\":\"");
    private static final byte[] NODE = ascii("\",\"node\":\"");
    private static final byte[] SIGNAL = ascii("\",\"signal\":\"");
    private static final byte[] STATE = ascii("\",\"state\":\"");
    private static final byte[] BREACH = ascii("breach\"}");
    private static final byte[] SILENT = ascii("silent\"}");
    private static final byte[] CLEAR = ascii("clear\"}");
    private static final int[] POW10 = {1, 10, 100, 1_000, 10_000, 100_000, 1_000_000, 10_000_000, 100_000_000};

    private final IdsByBytes ids;
    /** The line's position while it is read. */
    private int p;

    /** {@code signals}: those tend.yaml declares; empty accepts every signal. */
    PlainLine(Set<String> signals) {
        this(signals, null);
    }

    /** As {@link #PlainLine(Set)}, each id the instance {@code canonical} gives for its value (null: a new one). */
    PlainLine(Set<String> signals, java.util.function.Function<String, Id> canonical) {
        this.ids = new IdsByBytes(v -> signals.isEmpty() || signals.contains(v), IdsByBytes.MAX_SIZE, canonical);
    }

    /** The transition on {@code b[0, len)} with its wire line, or null to leave the line to the general way. */
    LineResult.Event read(byte[] b, int len, long lineNumber) {
        if (!follows(b, len, 0, AT)) return null;
        p = AT.length;
        // the time: YYYY-MM-DDTHH:MM:SS[.fraction]Z
        int t = p;
        if (t + 21 > len || b[t + 4] != '-' || b[t + 7] != '-' || b[t + 10] != 'T' || b[t + 13] != ':' || b[t + 16] != ':') {
            return null;
        }
        int year = digits(b, t, 4);
        int month = digits(b, t + 5, 2);
        int day = digits(b, t + 8, 2);
        int hour = digits(b, t + 11, 2);
        int minute = digits(b, t + 14, 2);
        int second = digits(b, t + 17, 2);
        if ((year | month | day | hour | minute | second) < 0) return null;
        if (month < 1 || month > 12 || day < 1 || day > Rfc3339.lengthOfMonth(year, month) || hour > 23 || minute > 59
                || second > 59) {
            return null;
        }
        int q = t + 19;
        int nano = 0;
        if (b[q] == '.') {
            int start = ++q;
            while (q < len && b[q] >= '0' && b[q] <= '9') q++;
            int n = q - start;
            if (n == 0 || n > 9) return null;
            nano = digits(b, start, n) * POW10[9 - n];
        }
        if (q >= len || b[q] != 'Z') return null;
        p = q + 1;
        Instant at = Instant.ofEpochSecond(Rfc3339.epochDay(year, month, day) * 86_400L + hour * 3_600L + minute * 60L + second,
                nano);
        if (!follows(b, len, p, CLUSTER)) return null;
        p += CLUSTER.length;
        Id cluster = id(b, len);
        if (cluster == null) return null;
        int compact = p + 1; // the comma after the cluster's closing quote
        Id node = null;
        if (follows(b, len, p, NODE)) {
            p += NODE.length;
            node = id(b, len);
            if (node == null) return null;
        }
        if (!follows(b, len, p, SIGNAL)) return null;
        p += SIGNAL.length;
        int signalSlot = slot(b, len);
        if (signalSlot < 0 || !ids.isMarked(signalSlot)) return null;
        Id signal = ids.id(signalSlot);
        if (!follows(b, len, p, STATE)) return null;
        p += STATE.length;
        SignalState state;
        if (p + BREACH.length == len && follows(b, len, p, BREACH)) {
            state = SignalState.BREACH;
        } else if (p + SILENT.length == len && follows(b, len, p, SILENT)) {
            state = SignalState.SILENT;
        } else if (p + CLEAR.length == len && follows(b, len, p, CLEAR)) {
            state = SignalState.CLEAR;
        } else {
            return null;
        }
        HealthTransition transition = new HealthTransition(at, cluster, node, signal, state, Map.of(), Map.of());
        // the compact line: what follows the cluster is written as WireWriter#line writes it
        return new LineResult.Event(transition, lineNumber, new String(b, compact, len - compact, StandardCharsets.ISO_8859_1));
    }

    /** The id from {@code p} to its closing quote, {@code p} then at that quote; null when there is none. */
    private Id id(byte[] b, int len) {
        int slot = slot(b, len);
        return slot < 0 ? null : ids.id(slot);
    }

    private int slot(byte[] b, int len) {
        int start = p;
        int i = start;
        while (i < len && IdsByBytes.isIdByte(b[i])) i++;
        if (i == len || b[i] != '"') return -1;
        p = i;
        return ids.find(b, start, i);
    }

    /** The value of {@code n} decimal digits at {@code b[from]}, or -1 when one is not a digit. */
    private static int digits(byte[] b, int from, int n) {
        int v = 0;
        for (int i = from; i < from + n; i++) {
            int d = b[i] - '0';
            if (d < 0 || d > 9) return -1;
            v = v * 10 + d;
        }
        return v;
    }

    private static boolean follows(byte[] b, int len, int at, byte[] text) {
        if (at + text.length > len) return false;
        for (int i = 0; i < text.length; i++) {
            if (b[at + i] != text[i]) return false;
        }
        return true;
    }

    private static byte[] ascii(String s) {
        return s.getBytes(StandardCharsets.US_ASCII);
    }
}
