package dev.tend.playbooks;

import java.time.Duration;

/**
 * The loop limit: at most {@code count} runs of one playbook on the same target within
 * {@code period}; the next candidate is denied and escalated. Written {@code 3/24h}.
 */
public record LoopLimit(int count, Duration period) {
    static final String FORM = "a loop limit looks like 3/24h (at most 3 runs on one target within 24h)";

    public LoopLimit {
        CountPerPeriod.check("loop", count, 1, period);
    }

    /** Parses {@code 3/24h}; throws {@link IllegalArgumentException} explaining the form. */
    public static LoopLimit parse(String text) {
        CountPerPeriod c = CountPerPeriod.parse(text, FORM);
        return new LoopLimit(c.count, c.period);
    }

    @Override
    public String toString() {
        return CountPerPeriod.format(count, period);
    }
}
