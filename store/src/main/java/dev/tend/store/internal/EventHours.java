package dev.tend.store.internal;

import dev.tend.store.InputRow;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The hours of event time of the journal (table {@code journal_event_hours}, V2_23): for each
 * hour, the least and the greatest seq of the transitions and topology events whose event time
 * falls in it. Kept in the transaction that writes the rows; a period of event time is then
 * read as the seq range of its hours ({@link #of}), which the journal's primary key scans.
 * Rows deleted by the archive may leave an hour's range wider than what remains: a read
 * scans a little more, never less.
 *
 * <p>The greatest seq is written rounded up to a multiple of {@link #LAST_SEQ_STEP}, and a row
 * is rewritten only when a new row falls outside it: a live commit of a few transitions used
 * to rewrite its hour's page every time (one of the three or four pages it wrote), and now does
 * once per 1,024 rows; a read of the hour's last rows scans at most that many more.
 */
final class EventHours {
    static final long NANOS_PER_HOUR = 3_600_000_000_000L;
    private static final String UPSERT = "INSERT INTO journal_event_hours (hour, first_seq, last_seq) VALUES (?, ?, ?)"
            + " ON CONFLICT (hour) DO UPDATE SET"
            + " first_seq = CASE WHEN excluded.first_seq < journal_event_hours.first_seq"
            + " THEN excluded.first_seq ELSE journal_event_hours.first_seq END,"
            + " last_seq = CASE WHEN excluded.last_seq > journal_event_hours.last_seq"
            + " THEN excluded.last_seq ELSE journal_event_hours.last_seq END"
            // no write at all (the page stays clean) when the row already takes the new rows in
            + " WHERE excluded.first_seq < journal_event_hours.first_seq OR excluded.last_seq > journal_event_hours.last_seq";
    /** The greatest seq of an hour is recorded rounded up to a multiple of this. */
    static final long LAST_SEQ_STEP = 1024;

    private EventHours() {
    }

    /** The hour of an event time in nanoseconds, rounded towards zero like the migration's SQL. */
    static long of(long eventAtNanos) {
        return eventAtNanos / NANOS_PER_HOUR;
    }

    /** Whether a row is read by event time (a transition or topology event with one). */
    static boolean counts(InputRow r) {
        return r.eventAt() != null && (InputRow.TRANSITION.equals(r.kind()) || InputRow.TOPOLOGY.equals(r.kind()));
    }

    /** Widens the hours of {@code rows} (numbered, about to be inserted) to take them in. */
    static void record(StatementCache statements, Connection connection, List<InputRow> rows) throws SQLException {
        Map<Long, long[]> hours = new LinkedHashMap<>(); // a batch spans an hour or two of event time
        for (InputRow r : rows) {
            if (!counts(r)) continue;
            long[] range = hours.computeIfAbsent(of(Times.nanos(r.eventAt(), "InputRow.eventAt")),
                    h -> new long[]{Long.MAX_VALUE, Long.MIN_VALUE});
            range[0] = Math.min(range[0], r.seq());
            range[1] = Math.max(range[1], r.seq());
        }
        if (hours.isEmpty()) return;
        PreparedStatement ps = statements.prepare(connection, UPSERT);
        for (Map.Entry<Long, long[]> h : hours.entrySet()) {
            ps.setLong(1, h.getKey());
            ps.setLong(2, h.getValue()[0]);
            ps.setLong(3, Math.floorDiv(h.getValue()[1] + LAST_SEQ_STEP - 1, LAST_SEQ_STEP) * LAST_SEQ_STEP);
            ps.addBatch();
        }
        ps.executeBatch();
    }
}
