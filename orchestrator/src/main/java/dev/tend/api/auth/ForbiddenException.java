package dev.tend.api.auth;

import dev.tend.shared.TendException;

import java.util.Objects;

/** The caller's token lacks the role a route needs (HTTP 403); {@link #needed()} names it. */
public final class ForbiddenException extends TendException {
    private final Role needed;
    private final String caller;

    public ForbiddenException(Role needed, Caller caller) {
        super("this needs a token with the role " + needed.wireName() + "; token " + caller.name() + " has "
                + String.join(", ", caller.roles().stream().map(Role::wireName).sorted().toList()));
        this.needed = Objects.requireNonNull(needed, "needed");
        this.caller = caller.name();
    }

    public Role needed() {
        return needed;
    }

    public String caller() {
        return caller;
    }
}
