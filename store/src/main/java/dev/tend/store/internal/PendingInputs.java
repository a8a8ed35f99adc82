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
    private final List<InputRow> rows = new ArrayList<>();
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

    /** Binds row {@code i} of {@code rows} to the journal's columns from parameter {@code first + 1} ({@link RowInserts.Binder}). */
    static void bind(java.sql.PreparedStatement ps, int first, PendingInputs rows, int i) throws java.sql.SQLException {
        InputRow r = rows.row(i);
        ps.setLong(first + 1, rows.seq(i));
        ps.setString(first + 2, r.kind());
        ps.setLong(first + 3, rows.nowNanos(i));
        if (r.eventAt() == null) ps.setNull(first + 4, java.sql.Types.BIGINT);
        else ps.setLong(first + 4, rows.eventAtNanos(i));
        JdbiTx.text(ps, first + 5, r.cluster());
        ps.setString(first + 6, r.payload());
    }
}
