package dev.tend.store.internal;

import org.jdbi.v3.core.ConnectionException;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.HandleCallback;

import java.sql.Connection;
import java.sql.SQLException;
import java.util.function.Consumer;

/**
 * One write transaction on the SQLite writer connection, begun and ended by statements
 * ({@code BEGIN IMMEDIATE}, {@code COMMIT}, {@code ROLLBACK}) kept prepared, with the
 * connection left in auto-commit mode. Jdbi's transactions switch auto-commit off and on
 * again, and the SQLite driver begins a new transaction right after every commit while
 * auto-commit is off, which the switch back then commits: two transactions per commit, the
 * second empty, each taking and releasing the log's locks (four {@code fcntl} calls) and
 * parsing its statements again, on the driver thread before the answers go out (measured
 * with {@code strace}; DEVELOPERS.md, "Live path"). What is written and when it is durable
 * do not change: the commit is SQLite's {@code COMMIT}, as before.
 */
public final class SqliteWriteTransaction {
    private static final String BEGIN = "BEGIN IMMEDIATE";
    private static final String COMMIT = "COMMIT";
    private static final String ROLLBACK = "ROLLBACK";

    private SqliteWriteTransaction() {
    }

    /**
     * Runs {@code work} in one transaction on {@code handle}'s connection: committed when it
     * returns, rolled back when it or the commit throws. When the rollback fails too (a failed
     * commit may have ended the transaction already, or the connection is broken), the
     * connection is given to {@code discard}, so that no later transaction finds one left
     * open on it, and that failure is added to the one that passes through.
     */
    public static <T, X extends Exception> T run(Handle handle, StatementCache statements, HandleCallback<T, X> work,
                                                 Consumer<Connection> discard) throws X {
        Connection c = handle.getConnection();
        execute(statements, c, BEGIN);
        try {
            T result = work.withHandle(handle);
            execute(statements, c, COMMIT);
            return result;
        } catch (Throwable e) {
            rollBack(statements, c, e, discard);
            throw e;
        }
    }

    private static void rollBack(StatementCache statements, Connection c, Throwable cause, Consumer<Connection> discard) {
        try {
            execute(statements, c, ROLLBACK);
        } catch (RuntimeException e) {
            cause.addSuppressed(e);
            discard.accept(c);
        }
    }

    private static void execute(StatementCache statements, Connection c, String sql) {
        try {
            statements.prepare(c, sql).execute();
        } catch (SQLException e) {
            throw new ConnectionException(e);
        }
    }
}
