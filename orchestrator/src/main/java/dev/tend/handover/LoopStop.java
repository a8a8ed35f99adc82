package dev.tend.handover;

import java.time.Instant;
import java.util.Objects;

/**
 * A target on which the loop guard stopped a playbook (it remediated the target too often)
 * and no person has cleared it by the end of a report's period: automation will not act
 * there again until someone does.
 *
 * @param playbook  the playbook that was stopped
 * @param cluster   the target's cluster
 * @param node      the target's node; null for a cluster target
 * @param stoppedAt when the loop guard stopped it
 */
public record LoopStop(String playbook, String cluster, String node, Instant stoppedAt) {
    public LoopStop {
        Objects.requireNonNull(playbook, "LoopStop.playbook must not be null");
        Objects.requireNonNull(cluster, "LoopStop.cluster must not be null");
        Objects.requireNonNull(stoppedAt, "LoopStop.stoppedAt must not be null");
    }

    /** "cluster/node", or the cluster for a cluster target. */
    public String target() {
        return node == null ? cluster : cluster + "/" + node;
    }
}
