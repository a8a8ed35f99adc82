package dev.tend.store.internal;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import dev.tend.store.StoreException;
import org.jdbi.v3.core.Jdbi;
import org.jdbi.v3.core.transaction.TransactionIsolationLevel;
import org.postgresql.ds.PGSimpleDataSource;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteDataSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Duration;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.locks.ReentrantLock;
import javax.sql.DataSource;

/**
 * An opened, migrated database: where it is, how to get connections for writing and for
 * reading (HikariCP pools), and, on SQLite, the lock that lets one transaction at a time
 * write.
 */
public final class Database implements AutoCloseable {
    /** How long a SQLite connection waits for a lock held by another connection. */
    public static final Duration SQLITE_BUSY_TIMEOUT = Duration.ofSeconds(10);

    private final Dialect dialect;
    private final String location;
    /** Connections of one PostgreSQL store: the driver thread, HTTP reads and the tick share them. */
    public static final int POSTGRES_POOL_SIZE = 8;
    /** Read connections of one SQLite store (WAL lets them read beside the one writer). */
    public static final int SQLITE_READERS = 8;
    /** The size a SQLite store's write-ahead log is cut back to when it starts over (bytes). */
    static final int WAL_SIZE_LIMIT = 64 << 20;
    /** How long a caller waits for a free pooled connection before the store fails. */
    public static final Duration POOL_WAIT = Duration.ofSeconds(30);
    private static final AtomicInteger POOLS = new AtomicInteger();

    private final HikariDataSource writers;
    private final HikariDataSource readers;
    private final Jdbi writeJdbi;
    private final Jdbi readJdbi;
    private final ReentrantLock writeLock;
    /** On SQLite, the thread that checkpoints the write-ahead log; null on PostgreSQL. */
    private final WalCheckpointer checkpointer;

    private Database(Dialect dialect, String location, HikariDataSource writers, HikariDataSource readers, ReentrantLock writeLock,
                     WalCheckpointer checkpointer) {
        this.dialect = dialect;
        this.checkpointer = checkpointer;
        this.location = location;
        this.writers = writers;
        this.readers = readers;
        this.writeJdbi = Jdbi.create(writers);
        this.readJdbi = writers == readers ? writeJdbi : Jdbi.create(readers);
        this.writeLock = writeLock;
    }

    /**
     * Opens (creating it and its folders when missing) and migrates a SQLite file in WAL
     * mode with synchronous=NORMAL: a commit survives the tend process being killed (the WAL
     * is in the operating system's hands once written); only a power cut or an operating
     * system crash can lose the last commits, and never corrupts the file. Writes go through
     * one connection whose transactions begin IMMEDIATE; reads through others, which WAL
     * lets run beside a write.
     */
    public static Database sqlite(Path file) {
        Path path = file.toAbsolutePath().normalize();
        String location = path.toString();
        if (Files.isDirectory(path)) {
            throw new StoreException(location, "cannot open the store at " + location + ": it is a folder; give the path of a "
                    + "file (it is created when missing)");
        }
        try {
            if (path.getParent() != null) Files.createDirectories(path.getParent());
        } catch (IOException e) {
            throw new StoreException(location, "cannot open the store at " + location + ": cannot create its folder ("
                    + e + "); check the path and its permissions", e);
        }
        String url = "jdbc:sqlite:" + path;
        SqliteNativeLibrary.prepare();
        Path kept = SqliteNativeLibrary.keptDir();
        if (kept != null) StoreTemplate.copyInto(kept, path); // a new store: this jar's empty one
        SQLiteConfig writerConfig = sqliteConfig(SQLiteConfig.TransactionMode.IMMEDIATE);
        writerConfig.setWalAutocheckpoint(0); // the checkpointer's thread copies the log, not the committing one
        SQLiteDataSource writerSource = new SQLiteDataSource(writerConfig);
        writerSource.setUrl(url);
        SQLiteDataSource checkpointSource = new SQLiteDataSource(sqliteConfig(SQLiteConfig.TransactionMode.DEFERRED));
        checkpointSource.setUrl(url);
        SQLiteDataSource readerSource = new SQLiteDataSource(sqliteConfig(SQLiteConfig.TransactionMode.DEFERRED));
        readerSource.setUrl(url);
        try {
            Migrations.migrate(writerSource, Dialect.SQLITE, location);
            requireWal(writerSource, location);
        } catch (RuntimeException | SQLException e) {
            throw Failures.ofOpening(location, e);
        }
        // The writer's statement journals in memory: a multi-row INSERT inside a transaction keeps the
        // pages it changes until it ends (so that a failing row undoes the statement), and SQLite spills
        // that journal to a temporary file past 64 KB, which a commit of thousands of rows reaches at once:
        // a 1,000,000-line ingest wrote 0.7 GB to it in 385,000 calls, more calls than to the log itself
        // (DEVELOPERS.md, "Ingest"). Each statement's journal is a few pages; migrations (which may sort
        // millions of rows into a new index) open their own connection and keep SQLite's default.
        HikariDataSource writers = pool(writerSource, "writer", 1, "PRAGMA temp_store = MEMORY", location);
        HikariDataSource readers;
        try {
            readers = pool(readerSource, "reader", SQLITE_READERS, "PRAGMA query_only = true", location);
        } catch (RuntimeException e) {
            writers.close();
            throw e;
        }
        return new Database(Dialect.SQLITE, location, writers, readers, new ReentrantLock(), new WalCheckpointer(checkpointSource, path));
    }

    /**
     * Makes this jar's empty SQLite store ({@link StoreTemplate}) in the folder the launchers
     * name in {@value SqliteNativeLibrary#DIR_PROPERTY}, unless it is there; nothing without the
     * property. The launchers' training run calls it.
     */
    public static void makeTemplate() throws IOException {
        Path kept = SqliteNativeLibrary.keptDir();
        if (kept != null) StoreTemplate.make(kept);
    }

    /**
     * Opens and migrates a PostgreSQL database; {@code url} is {@code jdbc:postgresql://host:port/db?...}.
     * With {@code mustHoldStore}, a database that holds no tend store yet is refused instead of
     * given the schema (for commands that only read one).
     */
    public static Database postgres(String url, String user, String password, boolean mustHoldStore) {
        String location = Failures.redact(url);
        if (!url.startsWith("jdbc:postgresql:")) {
            throw new StoreException(location, "cannot open the store at " + location + ": tend stores live in a SQLite "
                    + "file (jdbc:sqlite:PATH or a file path) or in PostgreSQL (jdbc:postgresql://HOST:PORT/DATABASE)");
        }
        PGSimpleDataSource source = new PGSimpleDataSource();
        source.setApplicationName("tend");
        // Batched inserts as multi-row statements: several times faster for the journal; the url may say otherwise.
        source.setReWriteBatchedInserts(true);
        source.setURL(url);
        if (user != null) source.setUser(user);
        if (password != null) source.setPassword(password);
        try {
            if (mustHoldStore && !holdsStore(source)) {
                throw new StoreException(location, "no tend store in the database at " + location + ": run `tend ingest` or "
                        + "`tend serve` with this --db first, or check the database name");
            }
            Migrations.migrate(source, Dialect.POSTGRESQL, location);
        } catch (RuntimeException | SQLException e) {
            throw Failures.ofOpening(location, e);
        }
        HikariDataSource pool = pool(source, "pg", POSTGRES_POOL_SIZE, null, location);
        return new Database(Dialect.POSTGRESQL, location, pool, pool, null, null);
    }

    /**
     * A HikariCP pool over {@code source}: up to {@code size} connections, opened lazily
     * (minimum idle 0, so a command that reads once opens one), each run through
     * {@code initSql} when opened. Connections stay in auto-commit mode between uses; Jdbi
     * begins and ends its transactions on them, and HikariCP rolls back one returned dirty.
     */
    private static HikariDataSource pool(DataSource source, String role, int size, String initSql, String location) {
        HikariConfig config = new HikariConfig();
        config.setDataSource(source);
        config.setPoolName("tend-" + role + "-" + POOLS.incrementAndGet());
        config.setMaximumPoolSize(size);
        config.setMinimumIdle(0);
        config.setAutoCommit(true);
        config.setConnectionTimeout(POOL_WAIT.toMillis());
        // The store was just migrated through the same source, so the database is reachable; do not open one here.
        config.setInitializationFailTimeout(-1);
        if (initSql != null) config.setConnectionInitSql(initSql);
        try {
            return new HikariDataSource(config);
        } catch (RuntimeException e) {
            throw Failures.ofOpening(location, e);
        }
    }

    private static SQLiteConfig sqliteConfig(SQLiteConfig.TransactionMode mode) {
        SQLiteConfig config = new SQLiteConfig();
        config.setJournalMode(SQLiteConfig.JournalMode.WAL);
        config.setSynchronous(SQLiteConfig.SynchronousMode.NORMAL);
        config.setBusyTimeout((int) SQLITE_BUSY_TIMEOUT.toMillis());
        config.setTransactionMode(mode);
        // no "SELECT last_insert_rowid()" prepared and run after every INSERT: the store numbers its rows itself
        config.setGetGeneratedKeys(false);
        // the log file is cut back to 64 MB when it starts over: it grew to 200 to 280 MB in a 1,000,000-line
        // ingest and stayed that size beside the store, and removing it at the close took 50 ms (DEVELOPERS.md, "Ingest")
        config.setJournalSizeLimit(WAL_SIZE_LIMIT);
        // SQLite's multi-thread mode on each connection: no mutex of its own taken and released in every call
        // (each bind, step and column read), about a twentieth of the CPU of writing the journal (DEVELOPERS.md,
        // "Ingest"). Safe as SQLite states it (https://www.sqlite.org/threadsafe.html): no connection, nor a
        // statement of one, is used by two threads at a time; the pools give a connection to one thread, the
        // writer's is used under the store's write lock, and sqlite-jdbc makes each call on a connection in turn.
        config.setOpenMode(org.sqlite.SQLiteOpenMode.NOMUTEX);
        return config;
    }

    /** Whether Flyway's history table of the migrations is visible on the search path. */
    private static boolean holdsStore(DataSource source) throws SQLException {
        try (Connection c = source.getConnection(); Statement s = c.createStatement();
             var rs = s.executeQuery("SELECT to_regclass('" + Migrations.HISTORY_TABLE + "') IS NOT NULL")) {
            return rs.next() && rs.getBoolean(1);
        }
    }

    private static void requireWal(SQLiteDataSource source, String location) throws SQLException {
        try (Connection c = source.getConnection(); Statement s = c.createStatement();
             var rs = s.executeQuery("PRAGMA journal_mode")) {
            String mode = rs.next() ? rs.getString(1) : "unknown";
            if (!"wal".equalsIgnoreCase(mode)) {
                throw new StoreException(location, "cannot open the store at " + location + " in WAL mode (SQLite reports '"
                        + mode + "'): WAL needs a local file system; put the store on a local disk");
            }
        }
    }

    public Dialect dialect() {
        return dialect;
    }

    public String location() {
        return location;
    }

    public Jdbi writeJdbi() {
        return writeJdbi;
    }

    public Jdbi readJdbi() {
        return readJdbi;
    }

    /** On PostgreSQL, reads in one callback share a snapshot only at REPEATABLE READ; SQLite's read transactions always do. */
    public TransactionIsolationLevel readIsolation() {
        return dialect == Dialect.POSTGRESQL ? TransactionIsolationLevel.REPEATABLE_READ : TransactionIsolationLevel.UNKNOWN;
    }

    /** Held around every write transaction on SQLite; null on PostgreSQL, where the database orders writers. */
    public ReentrantLock writeLock() {
        return writeLock;
    }

    /**
     * Takes a writer connection out of the pool (closed once given back, which rolls back
     * whatever it held open): a transaction on it could be neither committed nor rolled back.
     */
    public void discardWriter(Connection pooled) {
        writers.evictConnection(pooled);
    }

    /** A write transaction committed (on SQLite, its log wants checkpointing). */
    public void committed() {
        if (checkpointer != null) checkpointer.committed();
    }

    /** On SQLite, copy the write-ahead log now rather than within {@link WalCheckpointer#INTERVAL_MILLIS}. */
    public void copyLogSoon() {
        if (checkpointer != null) checkpointer.now();
    }

    @Override
    public void close() {
        if (checkpointer != null) checkpointer.close();
        RuntimeException failure = null;
        for (HikariDataSource pool : writers == readers ? new HikariDataSource[]{writers} : new HikariDataSource[]{writers, readers}) {
            try {
                pool.close();
            } catch (RuntimeException e) {
                if (failure == null) failure = e;
            }
        }
        if (failure != null) {
            throw new StoreException(location, "closing the store at " + location + " failed: " + failure.getMessage(), failure);
        }
    }
}
