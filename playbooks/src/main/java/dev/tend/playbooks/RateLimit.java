package dev.tend.playbooks;

import java.time.Duration;

/**
 * A start budget: at most {@code count} runs may start within any {@code period}. Written
 * {@code 10/1h}.
 */
public record RateLimit(int count, Duration period) {
    static final String FORM = "a rate looks like 10/1h (a count, a slash, then a duration such as 30m, 1h or 1d)";

    public RateLimit {
        CountPerPeriod.check("rate", count, 1, period);
    }

    /** Parses {@code 10/1h}; throws {@link IllegalArgumentException} explaining the form. */
    public static RateLimit parse(String text) {
        CountPerPeriod c = CountPerPeriod.parse(text, FORM);
        return new RateLimit(c.count, c.period);
    }

    @Override
    public String toString() {
        return CountPerPeriod.format(count, period);
    }
}
