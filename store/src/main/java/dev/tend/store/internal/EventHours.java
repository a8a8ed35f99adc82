package dev.tend.store.internal;

import dev.tend.store.InputRow;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.util.Arrays;

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
    static void record(StatementCache statements, Connection connection, PendingInputs rows) throws SQLException {
        // a batch spans an hour or two of event time: a short list, searched from its end, in primitives
        long[] hours = new long[4];
        long[] firstSeqs = new long[4];
        long[] lastSeqs = new long[4];
        int n = 0;
        for (int i = 0, size = rows.size(); i < size; i++) {
            if (!counts(rows.row(i))) continue;
            long hour = of(rows.eventAtNanos(i));
            long seq = rows.seq(i);
            int h = n - 1;
            while (h >= 0 && hours[h] != hour) h--;
            if (h < 0) {
                if (n == hours.length) {
                    hours = Arrays.copyOf(hours, n * 2);
                    firstSeqs = Arrays.copyOf(firstSeqs, n * 2);
                    lastSeqs = Arrays.copyOf(lastSeqs, n * 2);
                }
                h = n++;
                hours[h] = hour;
                firstSeqs[h] = seq;
                lastSeqs[h] = seq;
            } else {
                firstSeqs[h] = Math.min(firstSeqs[h], seq);
                lastSeqs[h] = Math.max(lastSeqs[h], seq);
            }
        }
        if (n == 0) return;
        PreparedStatement ps = statements.prepare(connection, UPSERT);
        for (int h = 0; h < n; h++) {
            ps.setLong(1, hours[h]);
            ps.setLong(2, firstSeqs[h]);
            ps.setLong(3, Math.floorDiv(lastSeqs[h] + LAST_SEQ_STEP - 1, LAST_SEQ_STEP) * LAST_SEQ_STEP);
            ps.addBatch();
        }
        ps.executeBatch();
    }
}
