package dev.tend.api;

import dev.tend.shared.TendException;

/**
 * A write sent to a standby (HTTP 503 not-leader, with the leader's address in the
 * {@value #HEADER} header when one leads): only the instance that holds the leader lease
 * takes commands and transitions. Nothing was applied; send it to the leader.
 */
public final class NotLeaderException extends TendException {
    public static final String HEADER = "X-Tend-Leader";
    private final String leaderUrl;

    public NotLeaderException(String message, String leaderUrl) {
        super(message);
        this.leaderUrl = leaderUrl;
    }

    /** Where the leader's API answers, or null while no instance leads. */
    public String leaderUrl() {
        return leaderUrl;
    }
}
