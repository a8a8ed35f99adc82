package dev.tend.shared.fleet;

/**
 * Replication settings of a cluster: each piece of data is kept in {@code factor} copies,
 * of which at least {@code minHealthy} must stay healthy. So at most
 * {@code factor - minHealthy} copies of one piece may be impaired at once (quorum-based
 * replication: Gifford, "Weighted Voting for Replicated Data", SOSP 1979).
 */
public record Replication(int factor, int minHealthy) {
    public Replication {
        if (factor < 1) throw new IllegalArgumentException("replication.factor must be at least 1, got " + factor);
        if (minHealthy < 1 || minHealthy > factor) {
            throw new IllegalArgumentException("replication.min-healthy must be between 1 and the factor (" + factor + "), got " + minHealthy);
        }
    }

    /** How many copies of one piece of data may be impaired while enough healthy copies remain. */
    public int tolerableImpaired() {
        return factor - minHealthy;
    }
}
