package dev.tend.store.internal;

import org.sqlite.SQLiteDataSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;

/**
 * Copies a SQLite store's write-ahead log into the database file on a thread of its own, at
 * most once per {@link #INTERVAL_MILLIS} while commits come in. SQLite would otherwise do it
 * inside the commit that fills the log past 1,000 pages, with two fsyncs (tens of
 * milliseconds on a virtual disk) that the committing thread, and every request waiting for
 * that commit, would wait for. Durability does not change: a commit is whole once its frames
 * are in the log, checkpointed or not; this only moves the copying.
 *
 * <p>A passive checkpoint never waits for the writer. When commits follow each other so
 * closely that the log is never found fully copied at the start of a write (where SQLite
 * starts it again from the beginning), it grows; past {@link #RESTART_BYTES} a restarting
 * checkpoint, which waits at most {@link #RESTART_WAIT_MILLIS} for the writer, starts it over.
 */
final class WalCheckpointer implements AutoCloseable {
    /** At most one checkpoint a second (common practice, no source: a bounded log, few fsyncs). */
    static final long INTERVAL_MILLIS = 1000;
    static final long RESTART_BYTES = 64L << 20;
    static final int RESTART_WAIT_MILLIS = 200;

    private final SQLiteDataSource source;
    private final Path wal;
    private final long intervalMillis;
    private final Object lock = new Object();
    private final Thread thread;
    // guarded by lock
    private boolean pending;
    private boolean soon;
    private boolean closed;

    WalCheckpointer(SQLiteDataSource source, Path database) {
        this(source, database, INTERVAL_MILLIS);
    }

    /** As above, at most one checkpoint per {@code intervalMillis} unless asked {@link #now()} (for tests). */
    WalCheckpointer(SQLiteDataSource source, Path database, long intervalMillis) {
        this.source = source;
        this.intervalMillis = intervalMillis;
        this.wal = database.resolveSibling(database.getFileName() + "-wal");
        this.thread = new Thread(this::run, "tend-wal-checkpoint");
        thread.setDaemon(true);
        thread.start();
    }

    /** A write transaction committed: the log has grown. */
    void committed() {
        synchronized (lock) {
            if (!pending) {
                pending = true;
                lock.notifyAll();
            }
        }
    }

    private void run() {
        Connection c = null;
        try {
            while (awaitCommit()) {
                if (c == null || c.isClosed()) c = source.getConnection();
                checkpoint(c);
                synchronized (lock) {
                    // woken early only by close and now()
                    long end = System.nanoTime() + intervalMillis * 1_000_000L;
                    for (long left = intervalMillis; !closed && !soon && left > 0; left = (end - System.nanoTime()) / 1_000_000L) {
                        lock.wait(left);
                    }
                    soon = false;
                }
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } catch (SQLException e) {
            // the store's own commits report a broken database; SQLite checkpoints when it closes
        } finally {
            if (c != null) {
                try {
                    c.close();
                } catch (SQLException ignored) {
                    // nothing was written through it
                }
            }
        }
    }

    private boolean awaitCommit() throws InterruptedException {
        synchronized (lock) {
            while (!pending && !closed) lock.wait();
            pending = false;
            return !closed;
        }
    }

    private void checkpoint(Connection c) throws SQLException {
        try (Statement s = c.createStatement()) {
            s.execute("PRAGMA wal_checkpoint(PASSIVE)");
            if (walBytes() > RESTART_BYTES) {
                s.execute("PRAGMA busy_timeout = " + RESTART_WAIT_MILLIS);
                s.execute("PRAGMA wal_checkpoint(RESTART)");
            }
        }
    }

    /** Checkpoint at once, not after the interval: the log has grown and a stop is near. */
    void now() {
        synchronized (lock) {
            pending = true;
            soon = true;
            lock.notifyAll();
        }
    }

    private long walBytes() {
        try {
            return Files.size(wal);
        } catch (IOException e) {
            return 0;
        }
    }

    /** Stops the thread (a checkpoint under way finishes first). */
    @Override
    public void close() {
        synchronized (lock) {
            closed = true;
            lock.notifyAll();
        }
        try {
            thread.join();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
