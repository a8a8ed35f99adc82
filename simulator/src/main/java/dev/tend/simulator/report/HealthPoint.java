package dev.tend.simulator.report;

import java.time.Instant;
import java.util.Objects;

/**
 * The most clusters that were unhealthy at once in the interval starting at {@code at}
 * (intervals are of equal length, see {@link ReplayReport#unhealthy()}).
 */
public record HealthPoint(Instant at, int unhealthyClusters) {
    public HealthPoint {
        Objects.requireNonNull(at, "at");
        if (unhealthyClusters < 0) throw new IllegalArgumentException("unhealthyClusters must be at least 0, got " + unhealthyClusters);
    }
}
