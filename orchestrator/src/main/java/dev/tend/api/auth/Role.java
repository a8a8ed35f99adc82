package dev.tend.api.auth;

import io.javalin.security.RouteRole;

import java.util.Locale;

/**
 * What a token may do. {@link #VIEWER} reads; {@link #OPERATOR} aborts runs, manages
 * exclusions, the fleet brake and sends transitions; {@link #APPROVER} approves and rejects.
 * Operators and approvers may also read: a person who acts must see what they act on.
 */
public enum Role implements RouteRole {
    VIEWER, OPERATOR, APPROVER;

    public String wireName() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The role written as {@code viewer}, {@code operator} or {@code approver}. */
    public static Role parse(String text) {
        for (Role r : values()) if (r.wireName().equals(text)) return r;
        throw new IllegalArgumentException("must be viewer, operator or approver, got '" + text + "'");
    }
}
