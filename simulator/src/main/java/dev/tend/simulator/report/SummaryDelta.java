package dev.tend.simulator.report;

import java.util.Objects;

/**
 * One summary field of two replays side by side. A yes/no field ({@code brake_engaged})
 * is carried as 1 or 0 with {@code flag} set.
 */
public record SummaryDelta(String field, long a, long b, boolean flag) {
    public SummaryDelta {
        Objects.requireNonNull(field, "field");
        if (flag && (a < 0 || a > 1 || b < 0 || b > 1)) {
            throw new IllegalArgumentException("a yes/no field (" + field + ") holds 0 or 1, got " + a + " and " + b);
        }
    }

    public long delta() {
        return b - a;
    }

    public boolean differs() {
        return a != b;
    }
}
