package dev.tend.handover;

import java.util.Objects;

/**
 * How many distinct candidates (playbook, cluster, node) a reason code held or denied in a
 * period. A verdict with several reasons counts under each of its codes.
 *
 * @param code   the reason code, e.g. {@code fleet-brake}
 * @param held   distinct candidates with a hold verdict carrying the code
 * @param denied distinct candidates with a deny verdict carrying the code
 */
public record ReasonCount(String code, int held, int denied) {
    public ReasonCount {
        Objects.requireNonNull(code, "ReasonCount.code must not be null");
        if (code.isBlank()) throw new IllegalArgumentException("ReasonCount.code must not be blank");
        if (held < 0) throw new IllegalArgumentException("ReasonCount.held must be 0 or more, got " + held);
        if (denied < 0) throw new IllegalArgumentException("ReasonCount.denied must be 0 or more, got " + denied);
    }
}
