package dev.tend.api.auth;

import dev.tend.shared.TendException;

/** Too many requests with a wrong token came from one address: answered 429 with Retry-After. */
public final class TooManyFailuresException extends TendException {
    private final long retryAfterSeconds;

    public TooManyFailuresException(long retryAfterSeconds) {
        super("too many requests with a missing or wrong token came from this address; try again in "
                + retryAfterSeconds + " s");
        this.retryAfterSeconds = retryAfterSeconds;
    }

    public long retryAfterSeconds() {
        return retryAfterSeconds;
    }
}
