package dev.tend.playbooks;

import java.time.Instant;
import java.util.Map;
import java.util.Objects;

/**
 * A freeze of {@code tend.yaml}: from {@code from} (inclusive) until {@code until}
 * (exclusive) no run starts on the clusters selected; candidates are held as
 * {@code window-closed} until the freeze ends.
 */
public record Freeze(Instant from, Instant until, String reason, TagSelector clusters) {
    public Freeze {
        Objects.requireNonNull(from, "freeze from");
        Objects.requireNonNull(until, "freeze until");
        if (!until.isAfter(from)) throw new IllegalArgumentException("freeze until (" + until + ") must be after from (" + from + ")");
        Objects.requireNonNull(reason, "freeze reason");
        if (reason.isBlank()) throw new IllegalArgumentException("freeze reason must say why");
        clusters = clusters == null ? TagSelector.all() : clusters;
    }

    /** True when the freeze holds at {@code t} for a cluster with {@code clusterTags}. */
    public boolean covers(Instant t, Map<String, String> clusterTags) {
        return !t.isBefore(from) && t.isBefore(until) && clusters.matches(clusterTags);
    }
}
