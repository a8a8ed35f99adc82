package dev.tend.store.internal;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.SQLException;
import java.util.List;

/**
 * Sends rows of the append path (journal rows, ledger entries) to one table as a batch. On
 * SQLite the rows go {@link #ROWS_PER_STATEMENT} at a time in one multi-row {@code INSERT}
 * (and the few left over one by one): every statement SQLite runs costs a step, a reset and
 * several calls across JNI whatever its size, and for the journal's narrow rows that was
 * about a third of inserting them (1,000,000 journal rows: 2.7 to 3.1 s of CPU one row per
 * statement, 1.7 to 1.8 s twenty rows per statement, measured 2026-12-03). PostgreSQL's
 * driver makes multi-row statements of a batch itself, so there each row is its own.
 *
 * <p>Immutable and thread-safe; the statements come from the transaction's {@link StatementCache}.
 *
 * @param <T> what holds the rows, each bound by its index
 */
final class RowInserts<T> {
    /** Rows per multi-row statement: 20 x 9 parameters stays far below SQLite's limit of 32,766. */
    static final int ROWS_PER_STATEMENT = 20;

    /** Binds the values of row {@code index} of {@code rows} to the parameters {@code first + 1} on (as many as a row has). */
    @FunctionalInterface
    interface Binder<T> {
        void bind(PreparedStatement ps, int first, T rows, int index) throws SQLException;
    }

    /** Parameters a row binds. */
    private final int parameters;
    private final String oneRow;
    private final String manyRows;
    private final Binder<T> binder;

    /** Inserts into {@code table}'s {@code columnList} ({@code columns} of them, comma-separated). */
    RowInserts(String table, String columnList, int columns, Binder<T> binder) {
        this(table, columnList, "(" + "?, ".repeat(columns - 1) + "?)", columns, binder);
    }

    /**
     * Inserts into {@code table}'s {@code columnList} the rows {@code values} writes (a
     * parenthesised list of the columns' values, which may hold constants), with
     * {@code parameters} parameters a row.
     */
    RowInserts(String table, String columnList, String values, int parameters, Binder<T> binder) {
        this.parameters = parameters;
        this.binder = binder;
        String head = "INSERT INTO " + table + " (" + columnList + ") VALUES ";
        this.oneRow = head + values;
        this.manyRows = head + String.join(", ", java.util.Collections.nCopies(ROWS_PER_STATEMENT, values));
    }

    /** Inserts the {@code n} rows of {@code rows}, in their order, on {@code connection}; {@code multiRow} on SQLite. */
    void insert(StatementCache statements, Connection connection, T rows, int n, boolean multiRow) throws SQLException {
        insert(statements, connection, rows, 0, n, multiRow);
    }

    /** Inserts rows {@code from} (inclusive) to {@code n} (exclusive) of {@code rows}, in their order. */
    void insert(StatementCache statements, Connection connection, T rows, int from, int n, boolean multiRow) throws SQLException {
        int i = from;
        if (multiRow && n - i >= ROWS_PER_STATEMENT) {
            PreparedStatement many = statements.prepare(connection, manyRows);
            for (; i + ROWS_PER_STATEMENT <= n; i += ROWS_PER_STATEMENT) {
                for (int r = 0; r < ROWS_PER_STATEMENT; r++) binder.bind(many, r * parameters, rows, i + r);
                many.addBatch();
            }
            many.executeBatch();
        }
        if (i == n) return;
        PreparedStatement one = statements.prepare(connection, oneRow);
        for (; i < n; i++) {
            binder.bind(one, 0, rows, i);
            one.addBatch();
        }
        one.executeBatch();
    }
}
