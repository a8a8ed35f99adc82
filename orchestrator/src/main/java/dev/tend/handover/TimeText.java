package dev.tend.handover;

import dev.tend.shared.time.InstantText;

import java.time.Duration;
import java.time.Instant;

/** How the handover renderings write times: RFC 3339 in UTC to the second, and short durations. */
final class TimeText {
    private TimeText() {
    }

    /** {@code 2027-03-14T02:17:00Z}; "-" for null. */
    static String at(Instant t) {
        return t == null ? "-" : InstantText.toSecond(t);
    }

    /** The time of day of {@code t} when it falls on the same UTC day as {@code ref}, else the full time. */
    static String near(Instant t, Instant ref) {
        String full = at(t);
        if (t == null || ref == null) return full;
        return at(ref).substring(0, 10).equals(full.substring(0, 10)) ? full.substring(11) : full;
    }

    /** {@code 2d3h}, {@code 1h30m}, {@code 45m}, {@code 20s}, {@code 0s}. */
    static String span(Duration d) {
        long s = Math.max(0, d.getSeconds());
        long days = s / 86_400, hours = s % 86_400 / 3600, minutes = s % 3600 / 60, seconds = s % 60;
        StringBuilder sb = new StringBuilder();
        if (days > 0) sb.append(days).append('d');
        if (hours > 0) sb.append(hours).append('h');
        if (minutes > 0 && days == 0) sb.append(minutes).append('m');
        if (seconds > 0 && days == 0 && hours == 0) sb.append(seconds).append('s');
        return sb.length() == 0 ? "0s" : sb.toString();
    }
}
