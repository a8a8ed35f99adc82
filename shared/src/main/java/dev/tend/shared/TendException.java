package dev.tend.shared;

/**
 * The one unchecked root of every failure tend reports. Subclasses are named for the
 * failure and keep their context in fields; the message says what happened, where, and
 * what to do next.
 */
public class TendException extends RuntimeException {
    public TendException(String message) {
        super(message);
    }

    public TendException(String message, Throwable cause) {
        super(message, cause);
    }
}
