package dev.tend.store;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;

/** A fresh database for one test, and raw SQL on it behind the store's back (to tamper). */
interface TestDatabase extends AutoCloseable {
    /** A new Store on this database; the caller closes it. */
    Store open();

    /** A plain JDBC connection to this database, outside any Store. */
    Connection connect() throws SQLException;

    /** Runs one update statement with positional arguments; returns the rows changed. */
    default int execute(String sql, Object... args) {
        try (Connection c = connect(); PreparedStatement s = c.prepareStatement(sql)) {
            for (int i = 0; i < args.length; i++) s.setObject(i + 1, args[i]);
            return s.executeUpdate();
        } catch (SQLException e) {
            throw new IllegalStateException("raw SQL failed: " + sql, e);
        }
    }

    /** Runs a query whose first column of its first row is text. */
    default String queryText(String sql, Object... args) {
        try (Connection c = connect(); PreparedStatement s = c.prepareStatement(sql)) {
            for (int i = 0; i < args.length; i++) s.setObject(i + 1, args[i]);
            try (ResultSet rs = s.executeQuery()) {
                return rs.next() ? rs.getString(1) : null;
            }
        } catch (SQLException e) {
            throw new IllegalStateException("raw SQL failed: " + sql, e);
        }
    }

    @Override
    void close();
}
