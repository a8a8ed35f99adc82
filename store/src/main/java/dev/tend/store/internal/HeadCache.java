package dev.tend.store.internal;

import dev.tend.store.LedgerEntry;
import dev.tend.store.StoreException;
import org.jdbi.v3.core.Handle;

import java.sql.Connection;
import java.util.concurrent.atomic.AtomicReference;

/**
 * The journal and ledger tails of one Store, kept in memory so that appends need no read.
 * A write transaction claims them once, at its first append; it publishes its new tails
 * when it commits and invalidates the cache when it fails, so the next claim reads them
 * again from the database.
 *
 * <p>SQLite: one process writes a file (documented on Store.openSqlite), and a Store
 * writes through one connection under its own lock, so the cache stays right unless
 * another connection committed; PRAGMA data_version tells exactly that, at the cost of
 * one pragma per transaction. PostgreSQL: several processes may write, so a claim locks the
 * ledger_head row (held to commit, which serialises appenders) and then reads the tails,
 * two statements per appending transaction.
 */
public final class HeadCache {
    private static final String READ_HEAD = "SELECT seq, hash FROM ledger_head WHERE id = 1";
    private static final String READ_INPUT_SEQ = "SELECT COALESCE(MAX(seq), 0) FROM input_journal";
    private static final String DATA_VERSION = "PRAGMA data_version";
    private static final String LOCK_HEAD = READ_HEAD + " FOR UPDATE";

    private final Dialect dialect;
    private final String location;
    private final AtomicReference<Heads> committed = new AtomicReference<>();

    public HeadCache(Dialect dialect, String location) {
        this.dialect = dialect;
        this.location = location;
    }

    /** The tails to continue from, inside the transaction of {@code handle}. */
    public Heads claim(Handle handle, StatementCache statements) {
        if (dialect == Dialect.POSTGRESQL) {
            Heads ledger = handle.createQuery(LOCK_HEAD)
                    .map((rs, ctx) -> new Heads(0, rs.getLong(1), rs.getString(2), null, 0))
                    .findOne()
                    .orElseThrow(this::missingHead);
            // A statement of its own: at READ COMMITTED it sees what the lock holder before us
            // committed, which a subquery of the locking statement (its snapshot taken before
            // the wait) would not.
            return ledger.withInputSeq(handle.createQuery(READ_INPUT_SEQ).mapTo(Long.class).one());
        }
        Connection connection = physical(handle.getConnection());
        long dataVersion = dataVersion(handle, statements);
        Heads cached = committed.get();
        if (cached != null && cached.connection() == connection && cached.dataVersion() == dataVersion) {
            return cached;
        }
        Heads ledger = handle.createQuery(READ_HEAD)
                .map((rs, ctx) -> new Heads(0, rs.getLong(1), rs.getString(2), connection, dataVersion))
                .findOne()
                .orElseThrow(this::missingHead);
        return ledger.withInputSeq(handle.createQuery(READ_INPUT_SEQ).mapTo(Long.class).one());
    }

    /**
     * PRAGMA data_version on a statement kept prepared: it runs in every transaction, and
     * through Jdbi it was parsed, prepared and mapped anew each time.
     */
    private long dataVersion(Handle handle, StatementCache statements) {
        try {
            java.sql.PreparedStatement ps = statements.prepare(handle.getConnection(), DATA_VERSION);
            try (java.sql.ResultSet rs = ps.executeQuery()) {
                if (!rs.next()) throw new StoreException(location, "PRAGMA data_version gave no row on the store at " + location);
                return rs.getLong(1);
            }
        } catch (java.sql.SQLException e) {
            throw new StoreException(location, "could not read PRAGMA data_version of the store at " + location + ": "
                    + e.getMessage(), e);
        }
    }

    /**
     * The driver's connection under the pool's wrapper: the pool hands out a new wrapper at
     * every checkout, so comparing wrappers would find the cache stale at every transaction
     * (and read both tails again each time).
     */
    private Connection physical(Connection c) {
        try {
            return c.isWrapperFor(Connection.class) ? c.unwrap(Connection.class) : c;
        } catch (java.sql.SQLException e) {
            return c;
        }
    }

    public void publish(Heads heads) {
        committed.set(heads);
    }

    public void invalidate() {
        committed.set(null);
    }

    private StoreException missingHead() {
        return new StoreException(location, "the ledger_head row of the store at " + location
                + " is missing, so the ledger cannot be continued; run `tend audit verify` and restore the store from a backup "
                + "(it should hold one row, id 1, with the last seq and hash, or 0 and " + LedgerEntry.GENESIS_HASH.substring(0, 8)
                + "... when empty)");
    }
}
