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
        write(handle, statements, ENQUEUE_PAGE, p, 1, 2);
    }

    static void update(Handle handle, StatementCache statements, PageRow p) {
        write(handle, statements, UPDATE_PAGE, p, 9, 1);
    }

    /** Runs {@code sql} with the page's id at parameter {@code idAt} and its other columns, in order, from {@code restFrom}. */
    private static void write(Handle handle, StatementCache statements, String sql, PageRow p, int idAt, int restFrom) {
        Objects.requireNonNull(p, "page");
        long created = Times.nanos(p.createdAt(), "PageRow.createdAt");
        long next = Times.nanos(p.nextAt(), "PageRow.nextAt");
        Long ended = p.endedAt() == null ? null : Times.toNanos(p.endedAt(), "PageRow.endedAt");
        try {
            PreparedStatement ps = statements.prepare(handle.getConnection(), sql);
            ps.setString(idAt, p.id());
            int i = restFrom;
            ps.setString(i++, p.channel());
            ps.setLong(i++, created);
            JdbiTx.text(ps, i++, p.payload());
            JdbiTx.text(ps, i++, p.state());
            ps.setInt(i++, p.attempts());
            ps.setLong(i++, next);
            JdbiTx.text(ps, i++, p.lastAnswer());
            if (ended == null) ps.setNull(i, Types.BIGINT);
            else ps.setLong(i, ended);
            ps.executeUpdate();
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }
}
