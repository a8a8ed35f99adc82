package dev.tend.shared.fleet;

/**
 * Replicated-log settings of a cluster: each partition has {@code factor} replicas and a
 * write is accepted while at least {@code minInSync} of them are in sync. So at most
 * {@code factor - minInSync} replicas of one partition may be impaired at once.
 */
public record Replication(int factor, int minInSync) {
    public Replication {
        if (factor < 1) throw new IllegalArgumentException("replication.factor must be at least 1, got " + factor);
        if (minInSync < 1 || minInSync > factor) {
            throw new IllegalArgumentException("replication.min-in-sync must be between 1 and the factor (" + factor + "), got " + minInSync);
        }
    }

    /** How many replicas of one partition may be impaired while writes still succeed. */
    public int tolerableImpaired() {
        return factor - minInSync;
    }
}
