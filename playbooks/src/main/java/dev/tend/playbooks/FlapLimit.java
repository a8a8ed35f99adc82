package dev.tend.playbooks;

import java.time.Duration;

/**
 * The flapping threshold: a signal that changed state more than {@code changes} times
 * within {@code period} is flapping. Written {@code 4/10m}.
 */
public record FlapLimit(int changes, Duration period) {
    static final String FORM = "a flapping limit looks like 4/10m (more than 4 state changes within 10m)";

    public FlapLimit {
        CountPerPeriod.check("flapping", changes, 1, period);
    }

    /** Parses {@code 4/10m}; throws {@link IllegalArgumentException} explaining the form. */
    public static FlapLimit parse(String text) {
        CountPerPeriod c = CountPerPeriod.parse(text, FORM);
        return new FlapLimit(c.count, c.period);
    }

    /** True when {@code changesInPeriod} state changes within {@link #period()} count as flapping. */
    public boolean isFlapping(int changesInPeriod) {
        return changesInPeriod > changes;
    }

    @Override
    public String toString() {
        return CountPerPeriod.format(changes, period);
    }
}
