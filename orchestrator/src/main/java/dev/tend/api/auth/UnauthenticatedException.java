package dev.tend.api.auth;

import dev.tend.shared.TendException;

/** A request carried no bearer token, or one this server does not accept (HTTP 401). */
public final class UnauthenticatedException extends TendException {
    public UnauthenticatedException(String message) {
        super(message);
    }
}
