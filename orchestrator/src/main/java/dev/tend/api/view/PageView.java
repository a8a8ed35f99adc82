package dev.tend.api.view;

import java.time.Instant;

/**
 * A page in the outbox: pending (not delivered yet, perhaps being tried again), delivered,
 * or failed (delivery given up).
 *
 * @param nextAt     when a pending page is tried next; null otherwise
 * @param lastAnswer the receiver's last answer; null before the first attempt
 * @param cluster    the cluster the page is about, or null
 * @param run        the run the page is about, or null
 */
public record PageView(String id, String channel, String kind, String state, String message, String cluster, String run,
                       Instant createdAt, int attempts, Instant nextAt, String lastAnswer, Instant endedAt) {
}
