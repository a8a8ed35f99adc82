package dev.tend.playbooks;

import dev.tend.shared.time.Durations;

import java.time.Duration;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** Parses the {@code COUNT/DURATION} form shared by rate, loop and flapping limits. */
final class CountPerPeriod {
    private static final Pattern FORM = Pattern.compile("(\\d{1,9})/(\\S+)");

    final int count;
    final Duration period;

    private CountPerPeriod(int count, Duration period) {
        this.count = count;
        this.period = period;
    }

    /** Throws {@link IllegalArgumentException} with {@code expected} when {@code text} is not COUNT/DURATION. */
    static CountPerPeriod parse(String text, String expected) {
        Matcher m = text == null ? null : FORM.matcher(text.strip());
        if (m == null || !m.matches()) throw new IllegalArgumentException(expected + ", got '" + text + "'");
        Duration period;
        try {
            period = Durations.parse(m.group(2));
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(expected + ", got '" + text + "' (" + e.getMessage() + ")");
        }
        return new CountPerPeriod(Integer.parseInt(m.group(1)), period);
    }

    static void check(String field, int count, int minCount, Duration period) {
        if (count < minCount) {
            throw new IllegalArgumentException(field + " count must be at least " + minCount + ", got " + count);
        }
        if (period == null || period.isNegative() || period.isZero()) {
            throw new IllegalArgumentException(field + " period must be longer than zero, got " + period);
        }
    }

    static String format(int count, Duration period) {
        return count + "/" + Durations.format(period);
    }
}
