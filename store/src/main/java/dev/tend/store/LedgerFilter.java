package dev.tend.store;

import java.time.Instant;

/**
 * Which entries {@link StoreReader#forEachLedger(LedgerFilter, java.util.function.Consumer)}
 * reads; start from {@link #all()}. Null fields do not filter.
 *
 * @param since    entries at or after this time
 * @param until    entries before this time
 * @param cluster  entries whose "cluster" is this
 * @param playbook entries whose "playbook" is this
 * @param kind     entries of this kind
 * @param run      entries whose "run" is this
 */
public record LedgerFilter(Instant since, Instant until, String cluster, String playbook, String kind, String run) {
    public LedgerFilter {
        if (since != null && until != null && until.isBefore(since)) {
            throw new IllegalArgumentException("LedgerFilter.until must not be before since " + since + ", got " + until);
        }
    }

    public static LedgerFilter all() {
        return new LedgerFilter(null, null, null, null, null, null);
    }

    public LedgerFilter withSince(Instant value) {
        return new LedgerFilter(value, until, cluster, playbook, kind, run);
    }

    public LedgerFilter withUntil(Instant value) {
        return new LedgerFilter(since, value, cluster, playbook, kind, run);
    }

    public LedgerFilter withCluster(String value) {
        return new LedgerFilter(since, until, value, playbook, kind, run);
    }

    public LedgerFilter withPlaybook(String value) {
        return new LedgerFilter(since, until, cluster, value, kind, run);
    }

    public LedgerFilter withKind(String value) {
        return new LedgerFilter(since, until, cluster, playbook, value, run);
    }

    public LedgerFilter withRun(String value) {
        return new LedgerFilter(since, until, cluster, playbook, kind, value);
    }
}
