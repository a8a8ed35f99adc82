package dev.tend.api.view;

import java.time.Instant;

/** The body of {@code POST /api/v1/exclusions}. {@code node} and {@code until} may be null. */
public record ExclusionRequest(String cluster, String node, String reason, String owner, Instant until) {
}
