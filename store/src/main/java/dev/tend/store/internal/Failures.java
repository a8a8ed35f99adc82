package dev.tend.store.internal;

import dev.tend.store.StoreException;
import org.jdbi.v3.core.JdbiException;
import org.sqlite.SQLiteErrorCode;
import org.sqlite.SQLiteException;

import java.sql.SQLException;

/**
 * Turns database failures into {@link StoreException}s whose message says where it
 * happened and what to do. Everything else passes through unchanged: a failure of the
 * caller's own code inside a transaction is the caller's to handle.
 */
public final class Failures {
    private Failures() {
    }

    /** {@code e} as the exception to throw for a transaction (or read) that failed. */
    public static RuntimeException ofTransaction(String location, RuntimeException e) {
        if (e instanceof StoreException) return e;
        if (!(e instanceof JdbiException)) return e;
        SQLException sql = sqlCause(e);
        return new StoreException(location, redact("a transaction on the store at " + location + " failed and was rolled "
                + "back, so nothing of it was written: " + explain(location, sql == null ? e : sql)), e);
    }

    /** The exception to throw when the store at {@code location} cannot be opened. */
    public static StoreException ofOpening(String location, Throwable e) {
        if (e instanceof StoreException s) return s;
        SQLException sql = sqlCause(e);
        return new StoreException(location, redact("cannot open the store at " + location + ": "
                + explain(location, sql == null ? e : sql)), e);
    }

    /** A sentence on what went wrong and what to do; names SQLite and PostgreSQL causes. */
    static String explain(String location, Throwable cause) {
        if (cause instanceof SQLiteException s) {
            SQLiteErrorCode code = s.getResultCode();
            String name = code == null ? "" : code.name();
            if (name.startsWith("SQLITE_BUSY") || name.startsWith("SQLITE_LOCKED")) {
                return "the file is locked by another writer (still busy after the busy timeout). A SQLite store has one "
                        + "writing process: stop the other tend process using " + location + ", or move to PostgreSQL";
            }
            if (name.startsWith("SQLITE_FULL")) return "the disk is full; free some space and try again";
            if (name.startsWith("SQLITE_READONLY") || name.startsWith("SQLITE_CANTOPEN") || name.startsWith("SQLITE_PERM")) {
                return "the file or its folder cannot be written (" + name + "); check their permissions";
            }
            if (name.startsWith("SQLITE_CORRUPT") || name.startsWith("SQLITE_NOTADB")) {
                return "the file is damaged or is not a SQLite database (" + name + "); restore it from a backup or "
                        + "point tend at another file";
            }
            return s.getMessage();
        }
        if (cause instanceof SQLException s && s.getSQLState() != null) {
            String state = s.getSQLState();
            if (state.startsWith("08") || state.equals("28P01") || state.equals("28000") || state.equals("3D000")) {
                return s.getMessage() + " (SQLSTATE " + state + "); check that the server runs and that the url, user and "
                        + "password are right";
            }
            if (state.equals("40001") || state.equals("40P01")) {
                return s.getMessage() + " (SQLSTATE " + state + "); it conflicted with another transaction: try again";
            }
            return s.getMessage() + " (SQLSTATE " + state + ")";
        }
        return String.valueOf(cause.getMessage());
    }

    static SQLException sqlCause(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof SQLException s) return s;
        }
        return null;
    }

    /** The url with any password parameter hidden, fit for messages and logs. */
    public static String redact(String url) {
        return url.replaceAll("(?i)(password=)[^&;]*", "$1***");
    }
}
