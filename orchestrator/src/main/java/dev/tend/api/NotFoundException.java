package dev.tend.api;

import dev.tend.shared.TendException;

/** The run, approval or exclusion a request names does not exist (HTTP 404). */
public final class NotFoundException extends TendException {
    public NotFoundException(String message) {
        super(message);
    }
}
