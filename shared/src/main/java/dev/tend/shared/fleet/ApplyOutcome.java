package dev.tend.shared.fleet;

/** What applying one event did to the fleet health view. */
public enum ApplyOutcome {
    /** A signal entered a problem state it was not in (opened or changed breach/silent). */
    OPENED,
    /** A signal went back to clear. */
    CLEARED,
    /** The same state again; only the last-seen time moved. */
    REPEATED,
    /** Older than the event already applied for the same key: changed nothing. */
    LATE,
    /** A topology event that changed the topology. */
    TOPOLOGY;

    /** True when the event changed a signal's state (a problem opened, changed or cleared). */
    public boolean isStateChange() {
        return this == OPENED || this == CLEARED;
    }
}
