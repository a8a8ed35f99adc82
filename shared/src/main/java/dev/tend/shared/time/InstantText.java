package dev.tend.shared.time;

import java.time.Instant;
import java.time.LocalDate;

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

    /** {@code t.toString()}, written without its formatter (the engine writes several per input); years outside 0000 to 9999 go to {@code toString()}. */
    public static String of(Instant t) {
        long sec = t.getEpochSecond();
        long day = Math.floorDiv(sec, 86_400L);
        LocalDate date = LocalDate.ofEpochDay(day);
        int year = date.getYear();
        if (year < 0 || year > 9999) return t.toString();
        int s = (int) (sec - day * 86_400L);
        int nano = t.getNano();
        char[] out = new char[30];
        put(out, 0, year, 4);
        out[4] = '-';
        put(out, 5, date.getMonthValue(), 2);
        out[7] = '-';
        put(out, 8, date.getDayOfMonth(), 2);
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
        return new String(out, 0, n);
    }

    /** {@code t} to the second: the fraction is dropped (truncated, not rounded). */
    public static String toSecond(Instant t) {
        return of(Instant.ofEpochSecond(t.getEpochSecond()));
    }

    private static void put(char[] out, int at, int value, int digits) {
        for (int i = at + digits - 1; i >= at; i--) {
            out[i] = (char) ('0' + value % 10);
            value /= 10;
        }
    }
}
