package dev.tend.store.internal;

import java.nio.charset.StandardCharsets;
import java.sql.ResultSet;
import java.sql.SQLException;

/**
 * A ledger row as stored, read by {@link LedgerVerifier}: every text column as the bytes SQLite
 * holds (what the writer wrote and hashed), null when NULL. Not a {@link dev.tend.store.LedgerEntry},
 * because a tampered row need not be a valid entry; and no Java string per column, because a
 * walk reads hundreds of thousands of rows and compares most columns only once
 * ({@link #same}). A column's text is that of {@code ResultSet.getString}: its bytes decoded
 * as UTF-8 ({@link #text}).
 */
record RawLedgerRow(long seq, long atNs, byte[] kindBytes, byte[] clusterBytes, byte[] playbookBytes, byte[] runBytes,
                    byte[] entry, byte[] prevHash, byte[] hash) {

    /** Reads the row of {@link Rows#LEDGER_COLUMNS}. */
    static RawLedgerRow of(ResultSet rs) throws SQLException {
        return new RawLedgerRow(rs.getLong(1), rs.getLong(2), rs.getBytes(3), rs.getBytes(4), rs.getBytes(5), rs.getBytes(6),
                rs.getBytes(7), rs.getBytes(8), rs.getBytes(9));
    }

    String kind() {
        return text(kindBytes);
    }

    String cluster() {
        return text(clusterBytes);
    }

    String playbook() {
        return text(playbookBytes);
    }

    String run() {
        return text(runBytes);
    }

    String describe() {
        return "entry " + seq + " (" + kind() + " at " + LedgerChain.formatAt(Times.fromNanos(atNs)) + ")";
    }

    /** A column's text as {@code ResultSet.getString} gives it: the bytes as UTF-8; null when NULL. */
    static String text(byte[] column) {
        return column == null ? null : new String(column, StandardCharsets.UTF_8);
    }

    /**
     * {@code Objects.equals(text(column), s)} without the string in the usual case: an ASCII
     * column is compared with {@code s} character by character; any other is decoded first.
     */
    static boolean same(byte[] column, String s) {
        if (column == null || s == null) return column == null && s == null;
        if (column.length != s.length()) {
            // an ASCII column has as many chars as bytes; any other may decode to s all the same
            return !ascii(column) && text(column).equals(s);
        }
        for (int i = 0; i < column.length; i++) {
            byte b = column[i];
            if (b < 0) return text(column).equals(s);
            if (b != s.charAt(i)) return false;
        }
        return true;
    }

    static boolean ascii(byte[] bytes) {
        for (byte b : bytes) if (b < 0) return false;
        return true;
    }
}
