package dev.tend.shared;

import java.util.Locale;

/**
 * Where one step of a run stands: the one definition the engine, its snapshots, the store's rows and the API use ({@link #wireName()} is what the store and the API carry).
 * An action step is {@link #RUNNING} while its call is out; a retried attempt first records
 * {@link #FAILED}, and the last attempt records how it ended.
 */
public enum StepState {
    /** The step's call is out, or its wait-healthy wait is on. */
    RUNNING,
    SUCCEEDED,
    /** The executor answered with failure (an attempt that will be retried records this too). */
    FAILED,
    /** No answer within the step's timeout, or the signals still active after a wait-healthy's {@code within}. */
    TIMED_OUT,
    /** The call was in flight when tend stopped and cannot be asked again by key. */
    UNKNOWN;

    /** The state as the API, the store and reports show it, e.g. {@code timed-out}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    /** The state named {@code wire} (as {@link #wireName()} writes it); empty for any other text. */
    public static java.util.Optional<StepState> of(String wire) {
        for (StepState s : values()) if (s.wireName().equals(wire)) return java.util.Optional.of(s);
        return java.util.Optional.empty();
    }
}
