package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;

import java.util.Optional;

/**
 * One safety rule a candidate run must pass. Guards are pure: they read the context and
 * the candidate and change nothing. Each guard objects with its own {@link ReasonCode}.
 */
public interface Guard {
    ReasonCode code();

    /** An objection, or empty when this guard lets the candidate through. */
    Optional<Objection> check(Candidate candidate, GuardContext context);
}
