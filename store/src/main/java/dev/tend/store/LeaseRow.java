package dev.tend.store;

import java.util.Objects;

/**
 * The leader lease as the database holds it.
 *
 * @param epoch     rises by one at every takeover; 0 before any instance led
 * @param holder    the instance that holds it (its name, unique per process)
 * @param address   where the holder's API answers, e.g. {@code http://10.0.4.7:7420}
 * @param expiresMs when it lapses unless renewed, on the database's clock (ms since 1970)
 * @param nowMs     the database's clock when this was read
 */
public record LeaseRow(long epoch, String holder, String address, long expiresMs, long nowMs) {
    public LeaseRow {
        Objects.requireNonNull(holder, "holder");
        Objects.requireNonNull(address, "address");
    }

    /** True when the lease lapsed: any instance may take it. */
    public boolean lapsed() {
        return expiresMs < nowMs;
    }
}
