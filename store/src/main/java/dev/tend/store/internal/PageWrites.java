package dev.tend.store.internal;

import dev.tend.store.PageRow;
import org.jdbi.v3.core.ConnectionException;
import org.jdbi.v3.core.Handle;

import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.sql.Types;
import java.util.Objects;

/**
 * The page outbox's writes inside a {@link JdbiTx}, on statements kept prepared: a new page
 * (one per page sent, in the driver's commit) and a page's later state (once per attempt, in
 * the courier's transactions, which take the writer from the driver's commits meanwhile).
 */
final class PageWrites {
    private static final String UPDATE_PAGE = "UPDATE page_outbox SET channel = ?, created_ns = ?, payload = ?, state = ?,"
            + " attempts = ?, next_ns = ?, last_answer = ?, ended_ns = ? WHERE id = ?";
    private static final String ENQUEUE_PAGE = "INSERT INTO page_outbox (" + Rows.PAGE_COLUMNS + ") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)"
            + " ON CONFLICT (id) DO NOTHING";

    private PageWrites() {
    }

    static void enqueue(Handle handle, StatementCache statements, PageRow p) {
        Objects.requireNonNull(p, "page");
        long created = Times.nanos(p.createdAt(), "PageRow.createdAt");
        long next = Times.nanos(p.nextAt(), "PageRow.nextAt");
        Long ended = p.endedAt() == null ? null : Times.toNanos(p.endedAt(), "PageRow.endedAt");
        try {
            PreparedStatement ps = statements.prepare(handle.getConnection(), ENQUEUE_PAGE);
            ps.setString(1, p.id());
            ps.setString(2, p.channel());
            ps.setLong(3, created);
            JdbiTx.text(ps, 4, p.payload());
            JdbiTx.text(ps, 5, p.state());
            ps.setInt(6, p.attempts());
            ps.setLong(7, next);
            JdbiTx.text(ps, 8, p.lastAnswer());
            if (ended == null) ps.setNull(9, Types.BIGINT);
            else ps.setLong(9, ended);
            ps.executeUpdate();
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }

    static void update(Handle handle, StatementCache statements, PageRow p) {
        Objects.requireNonNull(p, "page");
        long created = Times.nanos(p.createdAt(), "PageRow.createdAt");
        long next = Times.nanos(p.nextAt(), "PageRow.nextAt");
        Long ended = p.endedAt() == null ? null : Times.toNanos(p.endedAt(), "PageRow.endedAt");
        try {
            PreparedStatement ps = statements.prepare(handle.getConnection(), UPDATE_PAGE);
            ps.setString(1, p.channel());
            ps.setLong(2, created);
            JdbiTx.text(ps, 3, p.payload());
            JdbiTx.text(ps, 4, p.state());
            ps.setInt(5, p.attempts());
            ps.setLong(6, next);
            JdbiTx.text(ps, 7, p.lastAnswer());
            if (ended == null) ps.setNull(8, Types.BIGINT);
            else ps.setLong(8, ended);
            ps.setString(9, p.id());
            ps.executeUpdate();
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }
}
