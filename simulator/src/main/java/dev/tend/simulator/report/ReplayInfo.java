package dev.tend.simulator.report;

import java.time.Duration;
import java.util.List;
import java.util.Objects;

/**
 * How a replay was made: the seed of simulated outcomes, the playbooks (by content hash, so
 * a report never holds a path of the machine it ran on), the fleet, and the interval of
 * {@link ReplayReport#unhealthy()}.
 */
public record ReplayInfo(long seed, List<PlaybookRef> playbooks, String actionsSha256, String fleet, int clusters,
                         Duration healthInterval) {
    public ReplayInfo {
        playbooks = List.copyOf(playbooks);
        Objects.requireNonNull(fleet, "fleet");
        Objects.requireNonNull(healthInterval, "healthInterval");
        if (clusters < 0) throw new IllegalArgumentException("clusters must be at least 0, got " + clusters);
        if (healthInterval.isNegative() || healthInterval.isZero()) {
            throw new IllegalArgumentException("healthInterval must be longer than zero, got " + healthInterval);
        }
    }
}
