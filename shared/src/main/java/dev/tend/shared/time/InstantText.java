package dev.tend.shared.time;

import java.time.Instant;

/**
 * The formats tend writes instants in, one method each (all UTC, with {@code Z}):
 *
 * <ul>
 *   <li>{@link #of}: {@link Instant#toString()}'s text, a fraction of 3, 6 or 9 digits only when
 *   there is one ({@code 2027-03-14T02:17:00.500Z}): ledger entries, the ledger chain's times,
 *   stored and API times;</li>
 *   <li>{@link #toSecond}: to the second, no fraction ({@code 2027-03-14T02:17:00Z}): tables,
 *   the handover's renderings;</li>
 *   <li>{@link dev.tend.shared.wire.Rfc3339#format}: RFC 3339 with the fraction's trailing zeros
 *   left out ({@code 2027-03-14T02:17:00.5Z}): the wire format and replay reports.</li>
 * </ul>
 */
public final class InstantText {
    private InstantText() {
    }

    /** The longest text {@link #write} writes: {@code 9999-12-31T23:59:59.999999999Z}. */
    public static final int MAX = 30;

    /** {@code t.toString()}, written without its formatter (the engine writes several per input); years outside 0000 to 9999 go to {@code toString()}. */
    public static String of(Instant t) {
        char[] out = new char[MAX];
        int n = write(t, out);
        return n < 0 ? t.toString() : new String(out, 0, n);
    }

    /** {@code t} to the second: the fraction is dropped (truncated, not rounded). */
    public static String toSecond(Instant t) {
        return of(Instant.ofEpochSecond(t.getEpochSecond()));
    }

    /**
     * Writes the text of {@code t} into {@code out} (at least {@link #MAX} long) and returns its
     * length, or -1 for a year outside 0000 to 9999 (which {@link #of} leaves to {@code toString()}).
     */
    public static int write(Instant t, char[] out) {
        return write(t.getEpochSecond(), t.getNano(), out);
    }

    /** {@link #write(Instant, char[])} of the instant {@code sec} seconds and {@code nano} nanoseconds after the epoch, without it. */
    public static int write(long sec, int nano, char[] out) {
        long day = Math.floorDiv(sec, 86_400L);
        int s = (int) (sec - day * 86_400L);
        // days since 1970-01-01 to a proleptic Gregorian date: H. Hinnant, "chrono-Compatible
        // Low-Level Date Algorithms", days_from_civil's inverse civil_from_days (public domain)
        long z = day + 719_468;
        long era = Math.floorDiv(z, 146_097);
        long doe = z - era * 146_097;
        long yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
        long doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
        long mp = (5 * doy + 2) / 153;
        int dayOfMonth = (int) (doy - (153 * mp + 2) / 5 + 1);
        int month = (int) (mp < 10 ? mp + 3 : mp - 9);
        long year = yoe + era * 400 + (month <= 2 ? 1 : 0);
        if (year < 0 || year > 9999) return -1;
        put(out, 0, (int) year, 4);
        out[4] = '-';
        put(out, 5, month, 2);
        out[7] = '-';
        put(out, 8, dayOfMonth, 2);
        out[10] = 'T';
        put(out, 11, s / 3600, 2);
        out[13] = ':';
        put(out, 14, s / 60 % 60, 2);
        out[16] = ':';
        put(out, 17, s % 60, 2);
        int n = 19;
        if (nano > 0) {
            out[n++] = '.';
            if (nano % 1_000_000 == 0) {
                put(out, n, nano / 1_000_000, 3);
                n += 3;
            } else if (nano % 1000 == 0) {
                put(out, n, nano / 1000, 6);
                n += 6;
            } else {
                put(out, n, nano, 9);
                n += 9;
            }
        }
        out[n++] = 'Z';
        return n;
    }

    /** The tens and the units digit of 0 to 99: two digits a division (a snapshot writes hundreds of thousands of instants). */
    private static final char[] TENS = new char[100];
    private static final char[] UNITS = new char[100];

    static {
        for (int i = 0; i < 100; i++) {
            TENS[i] = (char) ('0' + i / 10);
            UNITS[i] = (char) ('0' + i % 10);
        }
    }

    /** {@code value} (0 or more, at most {@code digits} digits) as {@code digits} digits with leading zeros, at {@code at}. */
    private static void put(char[] out, int at, int value, int digits) {
        int i = at + digits - 1;
        while (i > at) {
            int q = value / 100;
            int r = value - q * 100;
            out[i] = UNITS[r];
            out[i - 1] = TENS[r];
            value = q;
            i -= 2;
        }
        if (i == at) out[i] = (char) ('0' + value);
    }
}
