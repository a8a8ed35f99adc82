package dev.tend.api.view;

import java.time.Instant;

/**
 * A cluster (node null) or node automation must not touch.
 *
 * @param until  null: until removed
 * @param active false once {@code until} has passed
 */
public record ExclusionView(String cluster, String node, String reason, String owner, Instant createdAt, Instant until,
                            boolean active) {
}
