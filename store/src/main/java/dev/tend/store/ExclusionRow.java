package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * A cluster or node on the exclusion list: automation does not touch it.
 *
 * @param cluster   the excluded cluster, or the cluster of the excluded node
 * @param node      the excluded node; null when the whole cluster is excluded
 * @param reason    why, in the operator's words
 * @param owner     who added it
 * @param createdAt when it was added
 * @param until     when it lapses; null when it lasts until removed
 */
public record ExclusionRow(String cluster, String node, String reason, String owner, Instant createdAt, Instant until) {
    public ExclusionRow {
        Objects.requireNonNull(cluster, "ExclusionRow.cluster must not be null");
        if (node != null && node.isEmpty()) {
            throw new IllegalArgumentException("ExclusionRow.node must be null (whole cluster) or a node id, got an empty string");
        }
        Objects.requireNonNull(reason, "ExclusionRow.reason must not be null");
        Objects.requireNonNull(owner, "ExclusionRow.owner must not be null");
        Objects.requireNonNull(createdAt, "ExclusionRow.createdAt must not be null");
        if (until != null && until.isBefore(createdAt)) {
            throw new IllegalArgumentException("ExclusionRow.until must not be before createdAt " + createdAt + ", got " + until);
        }
    }

    /** True when the whole cluster is excluded, not one node. */
    public boolean isWholeCluster() {
        return node == null;
    }
}
