package dev.tend.store;

import dev.tend.store.internal.Database;
import org.jdbi.v3.core.Handle;

import java.time.Duration;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalLong;

/**
 * The leader lease of instances sharing one PostgreSQL store (DESIGN.md section 9): one row
 * with an epoch, a holder, the holder's address and an expiry on the database's clock. An
 * instance takes it only when it lapsed (the epoch then rises by one), and renews it while
 * it leads; {@link Store#fence} makes every later commit of the store check the epoch in
 * the same transaction. Thread-safe; every call is one short transaction of its own.
 */
public final class LeaderLease {
    private static final String NOW_MS = "CAST(EXTRACT(EPOCH FROM clock_timestamp()) * 1000 AS BIGINT)";
    private final Database db;

    LeaderLease(Database db) {
        this.db = db;
    }

    /** The lease as it stands, or empty before any instance asked for it. */
    public Optional<LeaseRow> read() {
        try {
            return db.writeJdbi().withHandle(LeaderLease::row);
        } catch (RuntimeException e) {
            throw dev.tend.store.internal.Failures.ofTransaction(db.location(), e);
        }
    }

    static Optional<LeaseRow> row(Handle h) {
        return h.createQuery("SELECT epoch, holder, address, expires_ms, " + NOW_MS + " AS now_ms FROM leader_lease WHERE id = 1")
                .map((rs, ctx) -> new LeaseRow(rs.getLong("epoch"), rs.getString("holder"), rs.getString("address"),
                        rs.getLong("expires_ms"), rs.getLong("now_ms")))
                .findOne();
    }

    /**
     * Takes the lease for {@code holder} if it lapsed (or was never held): the epoch rises by
     * one and the lease runs for {@code ttl}. Returns the new epoch, or empty when another
     * instance holds a lease that has not lapsed.
     */
    public OptionalLong acquire(String holder, String address, Duration ttl) {
        Objects.requireNonNull(holder, "holder");
        Objects.requireNonNull(address, "address");
        try {
            return db.writeJdbi().inTransaction(h -> {
            h.createUpdate("INSERT INTO leader_lease (id, epoch, holder, address, expires_ms) VALUES (1, 0, '', '', 0) "
                    + "ON CONFLICT (id) DO NOTHING").execute();
            Optional<Long> epoch = h.createQuery("UPDATE leader_lease SET epoch = epoch + 1, holder = :holder, address = :address, "
                            + "expires_ms = " + NOW_MS + " + :ttl WHERE id = 1 AND expires_ms < " + NOW_MS + " RETURNING epoch")
                    .bind("holder", holder).bind("address", address).bind("ttl", ttl.toMillis())
                    .mapTo(Long.class).findOne();
            return epoch.map(OptionalLong::of).orElse(OptionalLong.empty());
            });
        } catch (RuntimeException e) {
            throw dev.tend.store.internal.Failures.ofTransaction(db.location(), e);
        }
    }

    /** Extends the lease of {@code epoch} by {@code ttl} from now; false when another instance took it since. */
    public boolean renew(long epoch, Duration ttl) {
        try {
            return db.writeJdbi().withHandle(h -> h.createUpdate("UPDATE leader_lease SET expires_ms = " + NOW_MS
                    + " + :ttl WHERE id = 1 AND epoch = :epoch").bind("ttl", ttl.toMillis()).bind("epoch", epoch).execute() == 1);
        } catch (RuntimeException e) {
            throw dev.tend.store.internal.Failures.ofTransaction(db.location(), e);
        }
    }

    /** Lets the lease of {@code epoch} lapse now (a clean stop), so a standby takes over without waiting. */
    public void release(long epoch) {
        try {
            db.writeJdbi().useHandle(h -> h.createUpdate("UPDATE leader_lease SET expires_ms = 0 WHERE id = 1 AND epoch = :epoch")
                    .bind("epoch", epoch).execute());
        } catch (RuntimeException e) {
            throw dev.tend.store.internal.Failures.ofTransaction(db.location(), e);
        }
    }

    /**
     * In a transaction of the leader: locks the lease row against takeovers until commit and
     * throws {@link LeaseLostException} when its epoch is no longer {@code epoch}. A leader
     * stopped in the middle of a transaction holds the lock; the session ends after 5 seconds
     * idle in it, so a takeover is delayed by at most that.
     */
    static void check(Handle h, String location, long epoch) {
        h.execute("SET LOCAL idle_in_transaction_session_timeout = 5000");
        Optional<LeaseRow> row = h.createQuery("SELECT epoch, holder, address, expires_ms, " + NOW_MS
                        + " AS now_ms FROM leader_lease WHERE id = 1 FOR SHARE")
                .map((rs, ctx) -> new LeaseRow(rs.getLong("epoch"), rs.getString("holder"), rs.getString("address"),
                        rs.getLong("expires_ms"), rs.getLong("now_ms")))
                .findOne();
        if (row.isPresent() && row.get().epoch() == epoch) return;
        String now = row.map(r -> "epoch " + r.epoch() + " is held by " + r.holder() + " at " + r.address()).orElse("no lease is held");
        throw new LeaseLostException(location, epoch, "this instance led under epoch " + epoch + " of the leader lease of "
                + location + ", but " + now + "; the commit was rolled back and nothing of it was written: this instance "
                + "stops leading");
    }
}
