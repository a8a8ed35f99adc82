package dev.tend.simulator.report;

import java.util.Objects;

/**
 * One summary field of two replays side by side. A yes/no field ({@code brake_engaged})
 * is carried as 1 or 0 with {@code flag} set. {@code field} is the JSON report's name;
 * {@link #label()} is what a person reads in the text and HTML forms.
 */
public record SummaryDelta(String field, long a, long b, boolean flag) {
    private static final java.util.Map<String, String> LABELS = java.util.Map.ofEntries(
            java.util.Map.entry("runs_started", "runs started"),
            java.util.Map.entry("runs_succeeded", "runs succeeded"),
            java.util.Map.entry("runs_failed", "runs failed"),
            java.util.Map.entry("runs_unfinished", "runs not ended"),
            java.util.Map.entry("runs_stood_down", "runs stood down"),
            java.util.Map.entry("held", "decisions held"),
            java.util.Map.entry("denied", "decisions denied"),
            java.util.Map.entry("approvals_requested", "approvals requested"),
            java.util.Map.entry("max_concurrent_runs", "most runs at once"),
            java.util.Map.entry("brake_engaged", "fleet brake engaged"),
            java.util.Map.entry("hidden_events", "events hidden"));

    public SummaryDelta {
        Objects.requireNonNull(field, "field");
        if (flag && (a < 0 || a > 1 || b < 0 || b > 1)) {
            throw new IllegalArgumentException("a yes/no field (" + field + ") holds 0 or 1, got " + a + " and " + b);
        }
    }

    /** The field in words ("most runs at once" for {@code max_concurrent_runs}). */
    public String label() {
        return LABELS.getOrDefault(field, field.replace('_', ' '));
    }

    public long delta() {
        return b - a;
    }

    public boolean differs() {
        return a != b;
    }
}
