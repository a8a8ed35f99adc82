package dev.tend.shared.time;

import java.time.Duration;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The compact duration syntax of playbooks and config: a whole number and a unit,
 * {@code s}, {@code m}, {@code h} or {@code d}, optionally chained: {@code 90s},
 * {@code 5m}, {@code 1h30m}, {@code 7d}. At most {@link #MAX} (3650d): every time tend
 * computes from a duration (a deadline, an expiry, a window's end) must still fit what the
 * store keeps (up to 2262), and no remediation waits ten years.
 */
public final class Durations {
    private static final Pattern WHOLE = Pattern.compile("(?:\\d+[smhd])+");
    private static final Pattern PART = Pattern.compile("(\\d+)([smhd])");

    /** The longest duration tend accepts anywhere: ten years of days. */
    public static final Duration MAX = Duration.ofDays(3650);

    private Durations() {
    }

    /**
     * Parses {@code text}; throws {@link IllegalArgumentException} whose message explains the
     * expected form, e.g. "a duration looks like 30s, 5m, 6h or 1d, got '5 minutes'".
     */
    public static Duration parse(String text) {
        if (text == null || !WHOLE.matcher(text).matches()) {
            throw new IllegalArgumentException("a duration looks like 30s, 5m, 6h or 1d, got '" + text + "'");
        }
        Duration d = Duration.ZERO;
        Matcher m = PART.matcher(text);
        try {
            while (m.find()) {
                long n = Long.parseLong(m.group(1));
                d = d.plus(switch (m.group(2)) {
                    case "s" -> Duration.ofSeconds(n);
                    case "m" -> Duration.ofMinutes(n);
                    case "h" -> Duration.ofHours(n);
                    default -> Duration.ofDays(n);
                });
            }
        } catch (NumberFormatException | ArithmeticException tooBig) {
            d = null;
        }
        if (d == null || d.compareTo(MAX) > 0) {
            throw new IllegalArgumentException("a duration is at most " + format(MAX) + " (ten years), got '" + text + "'");
        }
        return d;
    }

    /** The compact form of {@code d}, the inverse of {@link #parse} for whole seconds. */
    public static String format(Duration d) {
        long s = d.getSeconds();
        if (s == 0) return "0s";
        StringBuilder sb = new StringBuilder();
        if (s < 0) {
            sb.append('-');
            s = -s;
        }
        long days = s / 86400, hours = s % 86400 / 3600, minutes = s % 3600 / 60, seconds = s % 60;
        if (days > 0) sb.append(days).append('d');
        if (hours > 0) sb.append(hours).append('h');
        if (minutes > 0) sb.append(minutes).append('m');
        if (seconds > 0) sb.append(seconds).append('s');
        return sb.toString();
    }
}
