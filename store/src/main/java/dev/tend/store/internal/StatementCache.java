package dev.tend.store.internal;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.util.HashMap;
import java.util.Map;

/**
 * The prepared statements of the append path (journal rows, ledger entries, the ledger head),
 * kept per physical connection so that a transaction does not parse the same SQL again: the
 * pool hands out a new wrapper at each checkout and closes the statements made through it,
 * so they are prepared on the connection under the wrapper. A statement of a connection that
 * was closed (the pool retires connections) is prepared again.
 */
public final class StatementCache {
    private final Map<Connection, Map<String, PreparedStatement>> byConnection = new HashMap<>();

    /** The statement of {@code sql} on the physical connection under {@code pooled}, with no batch pending. */
    public synchronized PreparedStatement prepare(Connection pooled, String sql) throws SQLException {
        Connection physical = pooled.isWrapperFor(Connection.class) ? pooled.unwrap(Connection.class) : pooled;
        Map<String, PreparedStatement> statements = byConnection.get(physical);
        if (statements == null) {
            byConnection.keySet().removeIf(StatementCache::isClosed); // connections the pool retired
            statements = new HashMap<>();
            byConnection.put(physical, statements);
        }
        PreparedStatement ps = statements.get(sql);
        if (ps == null || ps.isClosed()) {
            ps = physical.prepareStatement(sql);
            statements.put(sql, ps);
        } else {
            ps.clearBatch(); // a batch that failed part way leaves nothing behind
            ps.clearParameters();
        }
        return ps;
    }

    private static boolean isClosed(Connection c) {
        try {
            return c.isClosed();
        } catch (SQLException e) {
            return true;
        }
    }
}
