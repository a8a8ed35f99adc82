package dev.tend.cli.ops;

import dev.tend.shared.TendException;

/**
 * The server answered an operator command with an error: {@link #status()} is the HTTP
 * status (409 when the engine refused it, 401/403 for the token, 404 for an unknown run,
 * 400 for a bad request), {@link #error()} the API's error code, the message its sentence.
 */
public final class OperationRefusedException extends TendException {
    private final int status;
    private final String error;

    public OperationRefusedException(int status, String error, String message) {
        super(message);
        this.status = status;
        this.error = error;
    }

    public int status() {
        return status;
    }

    public String error() {
        return error;
    }

    /** True when the engine refused the command (HTTP 409), rather than the request being wrong. */
    public boolean isRefusal() {
        return status == 409;
    }
}
