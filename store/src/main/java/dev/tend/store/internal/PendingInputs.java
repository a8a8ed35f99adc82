package dev.tend.store.internal;

import dev.tend.store.InputRow;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The journal rows a transaction appended and has not sent yet, as given (seq 0), with what
 * sending them needs worked out once: their seqs, consecutive from the first, and their times
 * in nanoseconds (checked when appended, bound and counted into their hours when sent).
 * Numbering a row used to copy it and the transaction's heads, and its times were converted five
 * times; a 1,000,000-line ingest made about 90 MB of those copies (DEVELOPERS.md, "Ingest").
 *
 * <p>Not thread-safe: one transaction's thread.
 */
final class PendingInputs {
    /** Every row, each binding its six columns. */
    private static final RowInserts<PendingInputs> ALL = new RowInserts<>("input_journal", Rows.INPUT_COLUMNS, 6, PendingInputs::bind);
    /**
     * A health transition's row: its kind written in the statement, five columns bound. Nearly
     * every row of an ingest is one, and binding the same kind a million times (a bound text is
     * copied into UTF-8, across JNI and into SQLite) was a twentieth of writing the journal.
     */
    private static final RowInserts<PendingInputs> TRANSITIONS = new RowInserts<>("input_journal", Rows.INPUT_COLUMNS,
            "(?, '" + InputRow.TRANSITION + "', ?, ?, ?, ?)", 5, PendingInputs::bindTransition);

    private final List<InputRow> rows = new ArrayList<>();
    /** The rows in the order {@link #insert} sends them (the transitions first), by index into {@link #rows}. */
    private int[] order = new int[256];
    private long[] nowNanos = new long[256];
    private long[] eventAtNanos = new long[256];
    private long firstSeq;

    /** Adds {@code row} (seq 0) as {@code seq}, which follows the last one added since {@link #clear}. */
    void add(InputRow row, long seq) {
        java.util.Objects.requireNonNull(row, "row");
        if (row.seq() != 0) {
            throw new IllegalArgumentException("appendInput takes rows with seq 0 (the store numbers them), got seq " + row.seq());
        }
        int i = rows.size();
        if (i == 0) firstSeq = seq;
        else if (seq != firstSeq + i) throw new IllegalStateException("journal row " + seq + " does not follow " + (firstSeq + i - 1));
        if (i == nowNanos.length) {
            nowNanos = Arrays.copyOf(nowNanos, i * 2);
            eventAtNanos = Arrays.copyOf(eventAtNanos, i * 2);
        }
        nowNanos[i] = Times.nanos(row.now(), "InputRow.now");
        eventAtNanos[i] = row.eventAt() == null ? 0 : Times.nanos(row.eventAt(), "InputRow.eventAt");
        rows.add(row);
    }

    int size() {
        return rows.size();
    }

    boolean isEmpty() {
        return rows.isEmpty();
    }

    InputRow row(int i) {
        return rows.get(i);
    }

    long seq(int i) {
        return firstSeq + i;
    }

    long nowNanos(int i) {
        return nowNanos[i];
    }

    /** The event time of row {@code i} in nanoseconds; meaningful only when the row has one. */
    long eventAtNanos(int i) {
        return eventAtNanos[i];
    }

    void clear() {
        rows.clear();
    }

    /**
     * Sends every row on {@code connection}. On SQLite ({@code multiRow}) the transitions go
     * first, through {@link #TRANSITIONS}, and the other rows after them: each row carries its
     * seq, so the order they are sent in changes nothing but the statements used.
     */
    void insert(StatementCache statements, java.sql.Connection connection, boolean multiRow) throws java.sql.SQLException {
        int n = rows.size();
        if (order.length < n) order = new int[Math.max(n, order.length * 2)];
        if (!multiRow) {
            for (int i = 0; i < n; i++) order[i] = i;
            ALL.insert(statements, connection, this, n, false);
            return;
        }
        int t = 0;
        for (int i = 0; i < n; i++) if (InputRow.TRANSITION.equals(rows.get(i).kind())) order[t++] = i;
        int o = t;
        for (int i = 0; i < n; i++) if (!InputRow.TRANSITION.equals(rows.get(i).kind())) order[o++] = i;
        if (t > 0) TRANSITIONS.insert(statements, connection, this, 0, t, true);
        if (t < n) ALL.insert(statements, connection, this, t, n, true);
    }

    /** Binds the row sent {@code k}th of {@code rows} to the journal's columns from parameter {@code first + 1} ({@link RowInserts.Binder}). */
    static void bind(java.sql.PreparedStatement ps, int first, PendingInputs rows, int k) throws java.sql.SQLException {
        int i = rows.order[k];
        InputRow r = rows.row(i);
        ps.setLong(first + 1, rows.seq(i));
        ps.setString(first + 2, r.kind());
        ps.setLong(first + 3, rows.nowNanos(i));
        if (r.eventAt() == null) ps.setNull(first + 4, java.sql.Types.BIGINT);
        else ps.setLong(first + 4, rows.eventAtNanos(i));
        JdbiTx.text(ps, first + 5, r.cluster());
        ps.setString(first + 6, r.payload());
    }

    /** Binds the transition sent {@code k}th of {@code rows} to {@link #TRANSITIONS}' five parameters from {@code first + 1}. */
    static void bindTransition(java.sql.PreparedStatement ps, int first, PendingInputs rows, int k) throws java.sql.SQLException {
        int i = rows.order[k];
        InputRow r = rows.row(i);
        ps.setLong(first + 1, rows.seq(i));
        ps.setLong(first + 2, rows.nowNanos(i));
        if (r.eventAt() == null) ps.setNull(first + 3, java.sql.Types.BIGINT);
        else ps.setLong(first + 3, rows.eventAtNanos(i));
        JdbiTx.text(ps, first + 4, r.cluster());
        ps.setString(first + 5, r.payload());
    }
}
