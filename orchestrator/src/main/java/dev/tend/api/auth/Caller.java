package dev.tend.api.auth;

import dev.tend.shared.Id;

import java.util.Objects;
import java.util.Set;

/**
 * Who sent a request: the name of the token it carried (written to the ledger as {@code by})
 * and the token's roles.
 */
public record Caller(String name, Set<Role> roles) {
    public Caller {
        Objects.requireNonNull(name, "name");
        if (!Id.isValid(name)) throw new IllegalArgumentException("token name: " + Id.describeInvalid(name));
        roles = Set.copyOf(roles);
        if (roles.isEmpty()) throw new IllegalArgumentException("token " + name + " needs at least one role");
    }

    /** True when the caller may do what needs {@code role}; every role may read. */
    public boolean may(Role role) {
        return role == Role.VIEWER ? !roles.isEmpty() : roles.contains(role);
    }
}
