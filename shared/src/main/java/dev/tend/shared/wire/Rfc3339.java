package dev.tend.shared.wire;

import dev.tend.shared.time.InstantText;

import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneOffset;

/**
 * RFC 3339 date-times (section 5.6), the time form of wire format v1.
 *
 * <p>{@link #parse} accepts {@code YYYY-MM-DDTHH:MM:SS[.fraction](Z|+HH:MM|-HH:MM)}: any
 * offset, 1 to 9 fraction digits, and a lowercase {@code t} or {@code z} (the section 5.6
 * note allows both). It rejects a time without a zone (the instant it names is unknown),
 * a space instead of {@code T} (the note permits one, but a single form keeps recordings
 * exchangeable and easy to check by eye), and more than 9 fraction digits (an
 * {@link Instant} holds nanoseconds and tend never quietly drops digits). {@code -00:00}
 * ("offset unknown", section 4.3) names the same instant as {@code Z}.
 *
 * <p>Leap seconds: a second of {@code 60} is accepted only where one can occur, at
 * 23:59:60 UTC on the last day of a month (section 5.7 and Appendix D), and it is read as
 * 23:59:59.999999999 UTC, the last instant before the next minute, whatever its fraction.
 * Java's time-scale has no 61st second, and rejecting the line would lose a real event
 * a source stamped during a leap second; the chosen instant keeps it after every event of
 * second 59 and before every event of the next minute. So
 * {@code 1990-12-31T23:59:60Z} and {@code 1990-12-31T15:59:60-08:00} both parse to
 * {@code 1990-12-31T23:59:59.999999999Z}.
 *
 * <p>{@link #format} writes UTC with {@code Z}, and a fraction only when the instant has
 * one, with no trailing zeros: {@code 2027-03-14T02:17:00Z},
 * {@code 1985-04-12T23:20:50.52Z}. {@code parse(format(t))} equals {@code t} for every
 * instant from year 0000 to 9999. Stateless and thread-safe.
 */
public final class Rfc3339 {
    /** The example shown in every message about a malformed time. */
    public static final String EXAMPLE = "2027-03-14T02:17:00Z";

    private static final int MAX_FRACTION_DIGITS = 9;
    private static final long FIRST_SECOND = -62_167_219_200L; // 0000-01-01T00:00:00Z
    private static final long LAST_SECOND = 253_402_300_799L; // 9999-12-31T23:59:59Z
    private static final int[] POW10 = {1, 10, 100, 1_000, 10_000, 100_000, 1_000_000, 10_000_000, 100_000_000};

    private Rfc3339() {
    }

    /**
     * Parses an RFC 3339 date-time with a zone. The instant must fall within the years 0000
     * to 9999 in UTC as well, so that {@link #format} can always write it back.
     *
     * @throws IllegalArgumentException for null, or with a message such as
     *         {@code '2027-03-14 02:17' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)},
     *         followed by the specific reason where there is one
     */
    public static Instant parse(String text) {
        if (text == null) throw new IllegalArgumentException("a time is required, like " + EXAMPLE);
        int n = text.length();
        if (n < 19 || !isDigits(text, 0, 4) || text.charAt(4) != '-' || !isDigits(text, 5, 7)
                || text.charAt(7) != '-' || !isDigits(text, 8, 10) || !isDigits(text, 11, 13)
                || text.charAt(13) != ':' || !isDigits(text, 14, 16) || text.charAt(16) != ':'
                || !isDigits(text, 17, 19)) {
            throw invalid(text, shapeHint(text));
        }
        char t = text.charAt(10);
        if (t != 'T' && t != 't') throw invalid(text, shapeHint(text));
        int year = number(text, 0, 4);
        int month = number(text, 5, 7);
        int day = number(text, 8, 10);
        int hour = number(text, 11, 13);
        int minute = number(text, 14, 16);
        int second = number(text, 17, 19);
        int i = 19;
        int nano = 0;
        if (i < n && text.charAt(i) == '.') {
            int start = ++i;
            while (i < n && isDigit(text.charAt(i))) i++;
            int digits = i - start;
            if (digits == 0) throw invalid(text, "a '.' must be followed by the fraction's digits");
            if (digits > MAX_FRACTION_DIGITS) {
                throw invalid(text, "it has " + digits + " fraction digits; at most 9 (nanoseconds) are kept");
            }
            nano = number(text, start, i) * POW10[MAX_FRACTION_DIGITS - digits];
        }
        int offsetSeconds = offset(text, i);
        if (month < 1 || month > 12) throw invalid(text, "the month must be 01 to 12");
        int lastDay = lengthOfMonth(year, month);
        if (day < 1 || day > lastDay) {
            throw invalid(text, "the day must be 01 to " + lastDay + " in " + text.substring(0, 7));
        }
        if (hour > 23) throw invalid(text, "the hour must be 00 to 23");
        if (minute > 59) throw invalid(text, "the minute must be 00 to 59");
        if (second > 60) throw invalid(text, "the second must be 00 to 59 (60 only for a leap second)");
        boolean leap = second == 60;
        long epochSecond = epochDay(year, month, day) * 86_400L
                + hour * 3_600L + minute * 60L + (leap ? 59 : second) - offsetSeconds;
        if (epochSecond < FIRST_SECOND || epochSecond > LAST_SECOND) {
            throw invalid(text, "in UTC it falls outside the years 0000 to 9999");
        }
        if (leap) {
            LocalDateTime utc = LocalDateTime.ofEpochSecond(epochSecond, 0, ZoneOffset.UTC);
            boolean endOfMonth = utc.getHour() == 23 && utc.getMinute() == 59
                    && utc.getDayOfMonth() == utc.toLocalDate().lengthOfMonth();
            if (!endOfMonth) {
                throw invalid(text, "a leap second (second 60) can only be 23:59:60 UTC on the last day of a month");
            }
            return Instant.ofEpochSecond(epochSecond, 999_999_999);
        }
        return Instant.ofEpochSecond(epochSecond, nano);
    }

    /**
     * Formats {@code t} as RFC 3339 in UTC with {@code Z}; fraction digits only when the
     * instant has a fraction, without trailing zeros.
     *
     * @throws IllegalArgumentException when {@code t} is outside the years 0000 to 9999,
     *         which RFC 3339 cannot write
     */
    public static String format(Instant t) {
        char[] out = new char[InstantText.MAX];
        return new String(out, 0, write(t, out));
    }

    /**
     * Writes {@link #format}'s text of {@code t} into {@code out} (at least
     * {@link InstantText#MAX} long) and returns its length: the journal writes one per line read.
     *
     * @throws IllegalArgumentException as {@link #format}
     */
    public static int write(Instant t, char[] out) {
        int n = InstantText.write(t, out);
        if (n < 0) throw new IllegalArgumentException("RFC 3339 writes years 0000 to 9999 only, got " + t);
        if (t.getNano() == 0) return n;
        // InstantText writes the fraction in groups of three digits; RFC 3339 (section 5.6) needs none of its trailing zeros
        int end = n - 1;
        while (out[end - 1] == '0') end--;
        out[end] = 'Z';
        return end + 1;
    }

    static int lengthOfMonth(int year, int month) {
        return switch (month) {
            case 2 -> (year % 4 == 0 && (year % 100 != 0 || year % 400 == 0)) ? 29 : 28;
            case 4, 6, 9, 11 -> 30;
            default -> 31;
        };
    }

    /** Days since 1970-01-01 of a valid proleptic Gregorian date of years 0 to 9999, without allocating. */
    static long epochDay(int year, int month, int day) {
        // the classic days-from-civil computation: counting years from March puts the leap day last
        int y = month <= 2 ? year - 1 : year;
        int era = Math.floorDiv(y, 400);
        int yearOfEra = y - era * 400;
        int dayOfYear = (153 * (month + (month > 2 ? -3 : 9)) + 2) / 5 + day - 1;
        int dayOfEra = yearOfEra * 365 + yearOfEra / 4 - yearOfEra / 100 + dayOfYear;
        return era * 146_097L + dayOfEra - 719_468L;
    }

    private static int offset(String text, int i) {
        int n = text.length();
        if (i == n) throw invalid(text, "it has no zone; add Z for UTC or an offset like +01:00");
        char c = text.charAt(i);
        if (c == 'Z' || c == 'z') {
            if (i + 1 != n) throw invalid(text, null);
            return 0;
        }
        if ((c != '+' && c != '-') || n != i + 6 || !isDigits(text, i + 1, i + 3) || text.charAt(i + 3) != ':'
                || !isDigits(text, i + 4, i + 6)) {
            throw invalid(text, "the zone must be Z or an offset like +01:00 or -08:00");
        }
        int hours = number(text, i + 1, i + 3);
        int minutes = number(text, i + 4, i + 6);
        if (hours > 23) throw invalid(text, "the offset's hours must be 00 to 23");
        if (minutes > 59) throw invalid(text, "the offset's minutes must be 00 to 59");
        int seconds = hours * 3600 + minutes * 60;
        return c == '-' ? -seconds : seconds;
    }

    /** "separate the date and the time with T" when that alone would fix the text, else null. */
    private static String shapeHint(String text) {
        if (text.length() > 10 && (text.charAt(10) == ' ' || text.charAt(10) == '_')) {
            try {
                parse(text.substring(0, 10) + 'T' + text.substring(11));
                return "separate the date and the time with T";
            } catch (IllegalArgumentException stillWrong) {
                return null;
            }
        }
        return null;
    }

    private static IllegalArgumentException invalid(String text, String reason) {
        StringBuilder sb = new StringBuilder().append('\'').append(WireText.shown(text))
                .append("' is not an RFC 3339 time with a zone (like ").append(EXAMPLE).append(')');
        if (reason != null) sb.append(": ").append(reason);
        return new IllegalArgumentException(sb.toString());
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    private static boolean isDigits(String s, int from, int to) {
        if (to > s.length()) return false;
        for (int i = from; i < to; i++) {
            if (!isDigit(s.charAt(i))) return false;
        }
        return true;
    }

    private static int number(String s, int from, int to) {
        int v = 0;
        for (int i = from; i < to; i++) v = v * 10 + (s.charAt(i) - '0');
        return v;
    }
}
