package dev.tend.store.internal;

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
import java.util.concurrent.locks.ReentrantLock;

/**
 * An opened, migrated database: where it is, how to get connections for writing and for
 * reading, and, on SQLite, the lock that lets one transaction at a time write.
 */
public final class Database implements AutoCloseable {
    /** How long a SQLite connection waits for a lock held by another connection. */
    public static final Duration SQLITE_BUSY_TIMEOUT = Duration.ofSeconds(10);

    private final Dialect dialect;
    private final String location;
    private final ConnectionPool writers;
    private final ConnectionPool readers;
    private final Jdbi writeJdbi;
    private final Jdbi readJdbi;
    private final ReentrantLock writeLock;

    private Database(Dialect dialect, String location, ConnectionPool writers, ConnectionPool readers, ReentrantLock writeLock) {
        this.dialect = dialect;
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
        SQLiteDataSource writerSource = new SQLiteDataSource(sqliteConfig(SQLiteConfig.TransactionMode.IMMEDIATE));
        writerSource.setUrl(url);
        SQLiteDataSource readerSource = new SQLiteDataSource(sqliteConfig(SQLiteConfig.TransactionMode.DEFERRED));
        readerSource.setUrl(url);
        try {
            Migrations.migrate(writerSource, Dialect.SQLITE, location);
            requireWal(writerSource, location);
        } catch (RuntimeException | SQLException e) {
            throw Failures.ofOpening(location, e);
        }
        ConnectionPool writers = new ConnectionPool(writerSource::getConnection, 1);
        ConnectionPool readers = new ConnectionPool(() -> queryOnly(readerSource.getConnection()), 4);
        return new Database(Dialect.SQLITE, location, writers, readers, new ReentrantLock());
    }

    /** Opens and migrates a PostgreSQL database; {@code url} is {@code jdbc:postgresql://host:port/db?...}. */
    public static Database postgres(String url, String user, String password) {
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
            Migrations.migrate(source, Dialect.POSTGRESQL, location);
        } catch (RuntimeException e) {
            throw Failures.ofOpening(location, e);
        }
        ConnectionPool pool = new ConnectionPool(source::getConnection, 8);
        return new Database(Dialect.POSTGRESQL, location, pool, pool, null);
    }

    private static SQLiteConfig sqliteConfig(SQLiteConfig.TransactionMode mode) {
        SQLiteConfig config = new SQLiteConfig();
        config.setJournalMode(SQLiteConfig.JournalMode.WAL);
        config.setSynchronous(SQLiteConfig.SynchronousMode.NORMAL);
        config.setBusyTimeout((int) SQLITE_BUSY_TIMEOUT.toMillis());
        config.setTransactionMode(mode);
        return config;
    }

    private static Connection queryOnly(Connection c) throws SQLException {
        try (Statement s = c.createStatement()) {
            s.execute("PRAGMA query_only = true");
        }
        return c;
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

    @Override
    public void close() {
        SQLException failure = null;
        for (ConnectionPool pool : writers == readers ? new ConnectionPool[]{writers} : new ConnectionPool[]{writers, readers}) {
            try {
                pool.close();
            } catch (SQLException e) {
                if (failure == null) failure = e;
            }
        }
        if (failure != null) {
            throw new StoreException(location, "closing the store at " + location + " failed: " + failure.getMessage(), failure);
        }
    }
}
