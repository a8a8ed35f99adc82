package dev.tend.store.internal;

import dev.tend.store.OpenReceipt;
import org.jdbi.v3.core.ConnectionException;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.util.ArrayList;
import java.util.List;

/**
 * The {@code open_receipts} table (V2_24) on the transaction's connection, through statements
 * kept prepared: a live commit adds to it, a close takes everything in it. The same SQL on
 * SQLite and PostgreSQL.
 */
final class OpenReceipts {
    private static final String ADD = "INSERT INTO open_receipts (kind, caller, accepted, rejected, requests, first_ns, last_ns)"
            + " VALUES (?, ?, ?, ?, ?, ?, ?) ON CONFLICT (kind, caller) DO UPDATE SET"
            + " accepted = open_receipts.accepted + excluded.accepted,"
            + " rejected = open_receipts.rejected + excluded.rejected,"
            + " requests = open_receipts.requests + excluded.requests,"
            + " first_ns = CASE WHEN excluded.first_ns < open_receipts.first_ns THEN excluded.first_ns ELSE open_receipts.first_ns END,"
            + " last_ns = CASE WHEN excluded.last_ns > open_receipts.last_ns THEN excluded.last_ns ELSE open_receipts.last_ns END";
    private static final String ALL = "SELECT kind, caller, accepted, rejected, requests, first_ns, last_ns FROM open_receipts"
            + " ORDER BY first_ns, kind, caller";
    private static final String DELETE_ALL = "DELETE FROM open_receipts";

    private OpenReceipts() {
    }

    static void add(StatementCache statements, Connection connection, List<OpenReceipt> receipts) {
        if (receipts.isEmpty()) return;
        try {
            addAll(statements, connection, receipts);
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }

    private static void addAll(StatementCache statements, Connection connection, List<OpenReceipt> receipts) throws SQLException {
        PreparedStatement ps = statements.prepare(connection, ADD);
        for (OpenReceipt r : receipts) {
            ps.setString(1, r.kind());
            ps.setString(2, r.caller());
            ps.setLong(3, r.accepted());
            ps.setLong(4, r.rejected());
            ps.setLong(5, r.requests());
            ps.setLong(6, Times.nanos(r.first(), "OpenReceipt.first"));
            ps.setLong(7, Times.nanos(r.last(), "OpenReceipt.last"));
            ps.addBatch();
        }
        ps.executeBatch();
    }

    /** Every open receipt, the oldest first, deleted from the table. */
    static List<OpenReceipt> take(StatementCache statements, Connection connection) {
        try {
            return takeAll(statements, connection);
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }

    private static List<OpenReceipt> takeAll(StatementCache statements, Connection connection) throws SQLException {
        List<OpenReceipt> open = new ArrayList<>();
        try (ResultSet rs = statements.prepare(connection, ALL).executeQuery()) {
            while (rs.next()) {
                open.add(new OpenReceipt(rs.getString(1), rs.getString(2), rs.getLong(3), rs.getLong(4), rs.getLong(5),
                        Times.fromNanos(rs.getLong(6)), Times.fromNanos(rs.getLong(7))));
            }
        }
        if (!open.isEmpty()) statements.prepare(connection, DELETE_ALL).executeUpdate();
        return open;
    }
}
