package dev.tend.store.internal;

import org.jdbi.v3.core.ConnectionFactory;

import java.sql.Connection;
import java.sql.SQLException;
import java.util.ArrayDeque;
import java.util.Deque;

/**
 * Keeps up to {@code maxIdle} open connections for reuse; opens more on demand. Jdbi
 * returns a connection through {@link #closeConnection}; one that was closed or left
 * inside a transaction is closed instead of kept. Thread-safe.
 */
public final class ConnectionPool implements ConnectionFactory, AutoCloseable {
    /** Opens a new connection, configured for its use. */
    @FunctionalInterface
    public interface Opener {
        Connection open() throws SQLException;
    }

    private final Opener opener;
    private final int maxIdle;
    private final Deque<Connection> idle = new ArrayDeque<>();
    private boolean closed;

    public ConnectionPool(Opener opener, int maxIdle) {
        this.opener = opener;
        this.maxIdle = maxIdle;
    }

    @Override
    public Connection openConnection() throws SQLException {
        synchronized (this) {
            if (closed) throw new SQLException("the store is closed");
            Connection c = idle.pollFirst();
            if (c != null) return c;
        }
        return opener.open();
    }

    @Override
    public void closeConnection(Connection c) throws SQLException {
        boolean keep = !c.isClosed() && c.getAutoCommit();
        synchronized (this) {
            if (keep && !closed && idle.size() < maxIdle) {
                idle.push(c);
                return;
            }
        }
        c.close();
    }

    @Override
    public void close() throws SQLException {
        SQLException first = null;
        synchronized (this) {
            closed = true;
            for (Connection c : idle) {
                try {
                    c.close();
                } catch (SQLException e) {
                    if (first == null) first = e;
                }
            }
            idle.clear();
        }
        if (first != null) throw first;
    }
}
