package dev.tend.store;

import dev.tend.shared.TendException;

/**
 * The store could not do what was asked: open or migrate its database, or run a
 * transaction. {@link #location()} names the SQLite file or the PostgreSQL url (without
 * its password); the message says what happened there and what to do next. When a
 * transaction fails with this exception, nothing of it was written.
 */
public class StoreException extends TendException {
    private final String location;

    public StoreException(String location, String message) {
        super(message);
        this.location = location;
    }

    public StoreException(String location, String message, Throwable cause) {
        super(message, cause);
        this.location = location;
    }

    /** The SQLite file or PostgreSQL url the failure happened on. */
    public String location() {
        return location;
    }
}
