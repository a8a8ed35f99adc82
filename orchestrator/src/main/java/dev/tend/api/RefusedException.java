package dev.tend.api;

import dev.tend.shared.TendException;

/**
 * The engine refused an operator command, or it had nothing to act on: an approval refused
 * (two-person rule, no longer pending), a run that already ended, a brake not engaged
 * (HTTP 409). The message is the engine's reason.
 */
public final class RefusedException extends TendException {
    public RefusedException(String message) {
        super(message);
    }
}
