package dev.tend.api;

import dev.tend.shared.TendException;

/**
 * The orchestrator could not take or commit a command or transitions: it stopped (a
 * failed commit stops it) or did not answer in time (HTTP 503). Nothing is applied
 * twice by trying again: a command that did commit is in the ledger.
 */
public final class DriverUnavailableException extends TendException {
    public DriverUnavailableException(String message) {
        super(message);
    }

    public DriverUnavailableException(String message, Throwable cause) {
        super(message, cause);
    }
}
