package dev.tend.store.internal;

import dev.tend.store.PageRow;
import org.jdbi.v3.core.ConnectionException;
import org.jdbi.v3.core.Handle;

import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.sql.Types;
import java.util.HashMap;
import java.util.Map;
import java.util.Objects;

/**
 * The page outbox's writes inside a {@link JdbiTx}: a new page on a statement kept prepared
 * (one per page sent, on the driver), a page's later state through Jdbi (once per attempt).
 */
final class PageWrites {
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

    static void update(Handle handle, PageRow p) {
        Objects.requireNonNull(p, "page");
        handle.createUpdate("UPDATE page_outbox SET channel = :channel, created_ns = :created_ns, payload = :payload,"
                        + " state = :state, attempts = :attempts, next_ns = :next_ns, last_answer = :last_answer,"
                        + " ended_ns = :ended_ns WHERE id = :id")
                .bindMap(columns(p))
                .execute();
    }

    private static Map<String, Object> columns(PageRow p) {
        Map<String, Object> m = new HashMap<>();
        m.put("id", p.id());
        m.put("channel", p.channel());
        m.put("created_ns", Times.toNanos(p.createdAt(), "PageRow.createdAt"));
        m.put("payload", p.payload());
        m.put("state", p.state());
        m.put("attempts", p.attempts());
        m.put("next_ns", Times.toNanos(p.nextAt(), "PageRow.nextAt"));
        m.put("last_answer", p.lastAnswer());
        m.put("ended_ns", p.endedAt() == null ? null : Times.toNanos(p.endedAt(), "PageRow.endedAt"));
        return m;
    }
}
