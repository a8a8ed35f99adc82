package dev.tend.bench;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Instant;

/**
 * The floor of reading a period of the ledger: one indexed SELECT of the period's rows with
 * plain JDBC, every column read (the entry's text included), nothing parsed or checked. Also a
 * main class, so that a fresh process can be timed against {@code tend handover} run fresh.
 *
 * <p>Arguments: the SQLite file, since and until (RFC 3339).
 */
public final class LedgerRowsFloor {
    private LedgerRowsFloor() {
    }

    public static void main(String[] args) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + args[0])) {
            long[] read = period(c, Instant.parse(args[1]), Instant.parse(args[2]));
            System.out.println(read[0] + " rows, " + read[1] + " characters");
        }
    }

    /** Reads the rows of {@code [since, until)} in seq order; returns {rows, characters of entry text}. */
    static long[] period(Connection c, Instant since, Instant until) throws SQLException {
        try (PreparedStatement s = c.prepareStatement("SELECT seq, at_ns, kind, cluster, playbook, run, entry, prev_hash, hash"
                + " FROM ledger WHERE at_ns >= ? AND at_ns < ? ORDER BY seq")) {
            s.setLong(1, nanos(since));
            s.setLong(2, nanos(until));
            return drain(s);
        }
    }

    /** Runs {@code s} and reads every column of every row; returns {rows, characters of entry text}. */
    static long[] drain(PreparedStatement s) throws SQLException {
        long rows = 0;
        long chars = 0;
        try (ResultSet rs = s.executeQuery()) {
            int columns = rs.getMetaData().getColumnCount();
            while (rs.next()) {
                rows++;
                for (int i = 1; i <= columns; i++) {
                    String v = rs.getString(i);
                    if (v != null) chars += v.length();
                }
            }
        }
        return new long[]{rows, chars};
    }

    static long nanos(Instant t) {
        return t.getEpochSecond() * 1_000_000_000L + t.getNano();
    }
}
