package dev.tend.shared;

import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;

/**
 * Where an approval stands: the one definition the engine, the store's rows, the API, the
 * handover and the CLI use. {@link #wireName()} is what the store, the API and reports carry.
 */
public enum ApprovalState {
    /** A person is asked; nobody answered yet. */
    PENDING,
    APPROVED,
    REJECTED,
    /** Nobody answered before it expired. */
    LAPSED,
    /** The problem went away, or the run was aborted, before anyone answered. */
    WITHDRAWN;

    private static final Set<String> WIRE_NAMES = Collections.unmodifiableSet(new LinkedHashSet<>(
            Arrays.stream(values()).map(ApprovalState::wireName).toList()));

    /** The state as stored and shown, e.g. {@code lapsed}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Every wire name, in the order above. */
    public static Set<String> wireNames() {
        return WIRE_NAMES;
    }

    /** The state named {@code wire}; empty for any other text. */
    public static Optional<ApprovalState> of(String wire) {
        for (ApprovalState s : values()) if (s.wireName().equals(wire)) return Optional.of(s);
        return Optional.empty();
    }

    /**
     * Checks the two times every record of an approval carries: both present, and the expiry
     * not before the request. {@code type} names the record in the message (say {@code ApprovalRow}).
     */
    public static void requireTimes(String type, java.time.Instant requestedAt, java.time.Instant expiresAt) {
        java.util.Objects.requireNonNull(requestedAt, type + ".requestedAt must not be null");
        java.util.Objects.requireNonNull(expiresAt, type + ".expiresAt must not be null");
        if (expiresAt.isBefore(requestedAt)) {
            throw new IllegalArgumentException(type + ".expiresAt must not be before requestedAt " + requestedAt + ", got " + expiresAt);
        }
    }
}
