package dev.tend.store;

import dev.tend.store.internal.Database;
import dev.tend.store.internal.Dialect;
import dev.tend.store.internal.Failures;
import dev.tend.store.internal.HeadCache;
import dev.tend.store.internal.SqliteWriteTransaction;
import dev.tend.store.internal.StatementCache;
import dev.tend.store.internal.JdbiReader;
import dev.tend.store.internal.JdbiTx;

import org.jdbi.v3.core.HandleCallback;

import java.nio.file.Path;
import java.util.Objects;
import java.util.concurrent.locks.ReentrantLock;
import java.util.function.Consumer;
import java.util.function.Function;

/**
 * tend's persistence: the input journal, the projections the CLI lists (runs, steps,
 * timers, exclusions, approvals, fleet state) and the hash-chained audit ledger, in a
 * SQLite file or a PostgreSQL database, always at this tend's schema version (opening
 * migrates). All access is scoped by a callback, so nothing is left open.
 *
 * <p>Thread-safe. On SQLite, write transactions of one Store run one at a time, and one
 * process writes a file (a second writing process waits up to the busy timeout, then
 * fails with a {@link StoreException} saying so); reads run beside writes. On PostgreSQL,
 * several Stores (several tend processes) may write; appends to the journal and the ledger
 * are ordered by a row lock on the ledger head, held until commit. Failures of the database
 * throw {@link StoreException}; exceptions thrown by the caller's callback roll the
 * transaction back and pass through unchanged.
 */
public final class Store implements AutoCloseable {
    private final Database db;
    private final HeadCache heads;
    private final StatementCache statements;
    private final ThreadLocal<Boolean> inWrite = ThreadLocal.withInitial(() -> false);
    private volatile boolean closed;
    /** The epoch every write transaction checks (see {@link #fence}); -1: none. */
    private volatile long fence = -1;

    private Store(Database db) {
        this.db = db;
        this.heads = new HeadCache(db.dialect(), db.location());
        this.statements = new StatementCache();
    }

    /**
     * Opens the SQLite store at {@code file}, creating the file (and its folders) when
     * missing, and migrates it. It runs in WAL mode with {@code synchronous=NORMAL}: a
     * commit survives the tend process being killed; only a power cut or an operating
     * system crash may lose the newest commits, and it never corrupts the file. A lock held
     * by another connection is waited for up to 10 seconds (busy_timeout). One process may
     * write a given file at a time; the file must be on a local disk.
     */
    /**
     * Makes this jar's empty SQLite store, which new stores are then copied from instead of
     * being migrated, in the folder the launchers name (system property {@code tend.native.dir});
     * nothing without it. For the launchers' training run (DEVELOPERS.md, "The store").
     */
    public static void makeTemplate() throws java.io.IOException {
        Database.makeTemplate();
    }

    public static Store openSqlite(Path file) {
        Objects.requireNonNull(file, "file");
        return new Store(Database.sqlite(file));
    }

    /**
     * Opens the store at a JDBC url and migrates it: {@code jdbc:postgresql://HOST:PORT/DB}
     * (user and password may be null when the url or the server supplies them), or
     * {@code jdbc:sqlite:PATH}, which is {@link #openSqlite} (user and password unused).
     */
    public static Store openJdbc(String url, String user, String password) {
        Objects.requireNonNull(url, "url");
        if (url.startsWith("jdbc:sqlite:")) return openSqlite(Path.of(url.substring("jdbc:sqlite:".length())));
        return new Store(Database.postgres(url, user, password, false));
    }

    /**
     * {@link #openJdbc} for a store that must already exist: a PostgreSQL database without a
     * tend store is refused with a {@link StoreException} instead of given the schema. (A
     * SQLite url is opened as {@link #openJdbc} does; callers check that the file exists.)
     */
    public static Store openExistingJdbc(String url, String user, String password) {
        Objects.requireNonNull(url, "url");
        if (url.startsWith("jdbc:sqlite:")) return openSqlite(Path.of(url.substring("jdbc:sqlite:".length())));
        return new Store(Database.postgres(url, user, password, true));
    }

    /** The SQLite file or the PostgreSQL url (password hidden) this store uses. */
    public String location() {
        return db.location();
    }

    /**
     * Runs {@code work} in one write transaction and returns what it returns. It commits when
     * {@code work} returns and rolls back when it throws; then the exception passes through
     * (a database failure as {@link StoreException}). Must not be called from inside another
     * transaction of this store on the same thread: use the {@link StoreTx} at hand.
     */
    public <T> T inTransaction(Function<StoreTx, T> work) {
        Objects.requireNonNull(work, "work");
        requireOpen();
        if (inWrite.get()) {
            throw new StoreException(location(), "inTransaction was called inside a transaction of the store at " + location()
                    + " on the same thread; use the StoreTx you were handed instead");
        }
        ReentrantLock lock = db.writeLock();
        inWrite.set(true);
        if (lock != null) lock.lock();
        try {
            requireOpen();
            JdbiTx[] done = new JdbiTx[1];
            long epoch = fence;
            HandleCallback<T, RuntimeException> body = handle -> {
                if (epoch >= 0) LeaderLease.check(handle, location(), epoch);
                JdbiTx tx = new JdbiTx(handle, location(), heads, statements, db.dialect() == Dialect.SQLITE);
                try {
                    T r = work.apply(tx);
                    tx.flush();
                    done[0] = tx;
                    return r;
                } finally {
                    tx.end();
                }
            };
            // SQLite: one transaction begun and committed by kept statements (see SqliteWriteTransaction)
            T result = db.dialect() == Dialect.SQLITE
                    ? db.writeJdbi().withHandle(handle -> SqliteWriteTransaction.run(handle, statements, body, db::discardWriter))
                    : db.writeJdbi().inTransaction(body);
            if (done[0].heads() != null) heads.publish(done[0].heads());
            db.committed();
            return result;
        } catch (RuntimeException e) {
            heads.invalidate();
            throw Failures.ofTransaction(location(), e);
        } finally {
            if (lock != null) lock.unlock();
            inWrite.remove();
        }
    }

    /** {@link #inTransaction} for work that returns nothing. */
    public void useTransaction(Consumer<StoreTx> work) {
        Objects.requireNonNull(work, "work");
        inTransaction(tx -> {
            work.accept(tx);
            return null;
        });
    }

    /**
     * Runs {@code work} with read access and returns what it returns. Its reads see one
     * consistent snapshot of what was committed when it began; they run beside writes.
     */
    public <T> T read(Function<StoreReader, T> work) {
        Objects.requireNonNull(work, "work");
        requireOpen();
        try {
            return db.readJdbi().inTransaction(db.readIsolation(), handle -> {
                JdbiReader reader = new JdbiReader(handle, location());
                try {
                    return work.apply(reader);
                } finally {
                    reader.end();
                }
            });
        } catch (RuntimeException e) {
            throw Failures.ofTransaction(location(), e);
        }
    }

    /**
     * The leader lease on this store's database (PostgreSQL only: instances that share a
     * SQLite file are refused by its lock instead). Throws {@link StoreException} on SQLite.
     */
    public LeaderLease lease() {
        if (db.dialect() != dev.tend.store.internal.Dialect.POSTGRESQL) {
            throw new StoreException(location(), "the store at " + location() + " is a SQLite file, which one process writes; "
                    + "a leader lease needs PostgreSQL");
        }
        return new LeaderLease(db);
    }

    /**
     * From now on every write transaction first checks, in the same transaction, that the
     * leader lease is still at {@code epoch} and fails with {@link LeaseLostException}
     * (nothing written) when it is not: fencing a leader that was deposed. PostgreSQL only.
     */
    public void fence(long epoch) {
        if (epoch < 1) throw new IllegalArgumentException("a lease epoch is 1 or more, got " + epoch);
        lease();
        this.fence = epoch;
    }

    /**
     * Asks for the write-ahead log to be copied into the database file now, on the store's own
     * thread, rather than within the second its checkpoints keep between them: a caller about to
     * stop calls it so that the copy runs beside its last work (a final snapshot) instead of in
     * {@link #close()}, where the rest of the log is copied. Nothing on PostgreSQL.
     */
    public void copyLogSoon() {
        if (!closed) db.copyLogSoon();
    }

    /** Closes the store's connections, after a write transaction in progress ends. Idempotent. */
    @Override
    public void close() {
        if (closed) return;
        ReentrantLock lock = db.writeLock();
        if (lock != null) lock.lock();
        try {
            if (closed) return;
            closed = true;
            db.close();
        } finally {
            if (lock != null) lock.unlock();
        }
    }

    private void requireOpen() {
        if (closed) throw new StoreException(location(), "the store at " + location() + " is closed; open it again");
    }

    @Override
    public String toString() {
        return "Store[" + location() + "]";
    }
}
