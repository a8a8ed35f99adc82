package dev.tend.shared.fleet;

import dev.tend.shared.SignalState;

import java.time.Instant;
import java.util.Objects;

/**
 * Where one signal stands: its state, since when (event time of the transition that
 * entered it), and the event time of the latest event applied for it.
 */
public record SignalStatus(SignalState state, Instant since, Instant lastAt) {
    public SignalStatus {
        Objects.requireNonNull(state, "state");
        Objects.requireNonNull(since, "since");
        Objects.requireNonNull(lastAt, "lastAt");
    }

    public boolean isProblem() {
        return state.isProblem();
    }
}
