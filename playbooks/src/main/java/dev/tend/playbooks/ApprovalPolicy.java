package dev.tend.playbooks;

import java.time.Duration;
import java.util.Map;
import java.util.Objects;

/**
 * When a run needs a human's approval before it starts.
 *
 * @param clusters     clusters whose runs need approval (the same selector as the trigger's); {@link TagSelector#all()} means every run
 * @param expiresAfter how long a request stays open; an unanswered request expires and the
 *                     candidate is dropped. Longer than zero.
 */
public record ApprovalPolicy(TagSelector clusters, Duration expiresAfter) {
    /** Used when a playbook's {@code approval} gives no {@code expires-after}. */
    public static final Duration DEFAULT_EXPIRY = Duration.ofHours(1);

    public ApprovalPolicy {
        Objects.requireNonNull(clusters, "approval.clusters");
        expiresAfter = expiresAfter == null ? DEFAULT_EXPIRY : expiresAfter;
        if (expiresAfter.isNegative() || expiresAfter.isZero()) {
            throw new IllegalArgumentException("approval.expires-after must be longer than zero, got " + expiresAfter);
        }
    }

    /** True when a run on a cluster with {@code clusterTags} needs approval. */
    public boolean isRequiredFor(Map<String, String> clusterTags) {
        return clusters.matches(clusterTags);
    }
}
