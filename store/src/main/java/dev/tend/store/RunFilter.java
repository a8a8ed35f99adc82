package dev.tend.store;

import java.time.Instant;

/**
 * Which runs {@link StoreReader#runs(RunFilter)} lists; start from {@link #all()}. Null
 * fields do not filter.
 *
 * @param activeOnly only runs that have not ended
 * @param cluster    only runs on this cluster
 * @param playbook   only runs of this playbook
 * @param since      only runs created at or after this time
 * @param limit      at most this many (the newest); 0 for no limit
 */
public record RunFilter(boolean activeOnly, String cluster, String playbook, Instant since, int limit) {
    public RunFilter {
        if (limit < 0) throw new IllegalArgumentException("RunFilter.limit must be 0 (no limit) or more, got " + limit);
    }

    public static RunFilter all() {
        return new RunFilter(false, null, null, null, 0);
    }

    public RunFilter withActiveOnly(boolean value) {
        return new RunFilter(value, cluster, playbook, since, limit);
    }

    public RunFilter withCluster(String value) {
        return new RunFilter(activeOnly, value, playbook, since, limit);
    }

    public RunFilter withPlaybook(String value) {
        return new RunFilter(activeOnly, cluster, value, since, limit);
    }

    public RunFilter withSince(Instant value) {
        return new RunFilter(activeOnly, cluster, playbook, value, limit);
    }

    public RunFilter withLimit(int value) {
        return new RunFilter(activeOnly, cluster, playbook, since, value);
    }
}
