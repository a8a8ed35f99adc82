package dev.tend.engine;

import dev.tend.shared.Target;

import java.time.Instant;
import java.util.Objects;

/**
 * A cluster or node automation must not touch: why, whose it is, until when (null: until removed).
 */
public record Exclusion(Target target, String reason, String owner, Instant createdAt, Instant until, String by) {
    public Exclusion {
        Objects.requireNonNull(target, "target");
        if (reason == null || reason.isBlank()) throw new IllegalArgumentException("an exclusion needs a reason");
        Objects.requireNonNull(createdAt, "createdAt");
        if (until != null && !until.isAfter(createdAt)) {
            throw new IllegalArgumentException("an exclusion's until (" + until + ") must be after its start (" + createdAt + ")");
        }
    }

    public boolean isActiveAt(Instant t) {
        return until == null || t.isBefore(until);
    }
}
