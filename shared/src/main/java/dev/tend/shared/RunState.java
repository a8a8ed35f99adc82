package dev.tend.shared;

import java.util.Locale;

/**
 * Where a run stands: the one definition the engine, its snapshots, the store's rows and the
 * API use. Terminal states: {@link #SUCCEEDED}, {@link #FAILED},
 * {@link #CANCELLED}, {@link #SHADOWED}, {@link #STOOD_DOWN}.
 */
public enum RunState {
    /** Policy asked a human; the run waits for an approval (or its expiry). */
    AWAITING_APPROVAL,
    /** Approved, but a guard holds it; looked at again when the reason can change. */
    HELD,
    /** Executing steps. */
    RUNNING,
    /** Stopped at a step boundary while the fleet brake is engaged. */
    PAUSED,
    /** A step's outcome is unknown after a crash and cannot be asked again; a person must look. */
    NEEDS_HUMAN,
    SUCCEEDED,
    FAILED,
    CANCELLED,
    /** Shadow mode: decided and recorded, never executed. */
    SHADOWED,
    /**
     * A gate found the run no longer needed before an action step (its trigger cleared, or a
     * mask or exclusion now applies); its on-stand-down steps ran and no further action step did.
     */
    STOOD_DOWN;

    public boolean isTerminal() {
        return this == SUCCEEDED || this == FAILED || this == CANCELLED || this == SHADOWED || this == STOOD_DOWN;
    }

    /** True while the run holds its target (counts for per-cluster, zone, fleet and blast-radius limits). */
    public boolean isActive() {
        return this == RUNNING || this == PAUSED || this == NEEDS_HUMAN;
    }

    /** The state as the API, the store and reports show it, e.g. {@code needs-human}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The state named {@code wire} (as {@link #wireName()} writes it); empty for any other text. */
    public static java.util.Optional<RunState> of(String wire) {
        for (RunState s : values()) if (s.wireName().equals(wire)) return java.util.Optional.of(s);
        return java.util.Optional.empty();
    }
}
