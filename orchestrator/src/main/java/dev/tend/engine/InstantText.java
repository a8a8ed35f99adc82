package dev.tend.engine;

import java.time.Instant;
import java.time.LocalDate;

/**
 * {@link Instant#toString()} without its formatter: the same text (ISO-8601 in UTC, a
 * fraction of 3, 6 or 9 digits only when there is one), written directly, for the times in
 * ledger entries, which the engine writes several of per input. Years outside 0000 to 9999
 * go to {@code Instant.toString()} itself.
 */
final class InstantText {
    private InstantText() {
    }

    static String of(Instant t) {
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

    private static void put(char[] out, int at, int value, int digits) {
        for (int i = at + digits - 1; i >= at; i--) {
            out[i] = (char) ('0' + value % 10);
            value /= 10;
        }
    }
}
