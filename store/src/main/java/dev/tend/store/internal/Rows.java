package dev.tend.store.internal;

import dev.tend.shared.wire.CompactLine;

import dev.tend.shared.ApprovalState;
import dev.tend.shared.RunState;
import dev.tend.shared.StepState;
import dev.tend.store.ApprovalRow;
import dev.tend.store.PageRow;
import dev.tend.store.ExclusionRow;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerEntry;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;
import dev.tend.store.TimerRow;

import java.sql.ResultSet;
import java.sql.SQLException;
import java.time.Instant;

/** The column lists of each table, and how a result row becomes a row record. */
public final class Rows {
    public static final String INPUT_COLUMNS = "seq, kind, now_ns, event_at_ns, cluster, payload";
    public static final String RUN_COLUMNS = "run_id, playbook, playbook_version, cluster, node, state, shadow, created_ns, "
            + "started_ns, ended_ns, outcome, current_step, detail";
    public static final String STEP_COLUMNS = "run_id, step_id, ordinal, state, attempt, started_ns, ended_ns, outcome, detail";
    public static final String TIMER_COLUMNS = "timer_key, due_ns, payload";
    public static final String EXCLUSION_COLUMNS = "cluster, node, reason, owner, created_ns, until_ns";
    public static final String APPROVAL_COLUMNS = "run_id, playbook, cluster, node, requested_by, requested_ns, expires_ns, "
            + "state, decided_by, decided_ns, reasons";
    public static final String LEDGER_COLUMNS = "seq, at_ns, kind, cluster, playbook, run, entry, prev_hash, hash";
    /** The node column's value for an exclusion of the whole cluster. */
    public static final String WHOLE_CLUSTER = "";

    private Rows() {
    }

    public static InputRow input(ResultSet rs) throws SQLException {
        Instant eventAt = instant(rs, 4);
        String cluster = rs.getString(5);
        return new InputRow(rs.getLong(1), rs.getString(2), Times.fromNanos(rs.getLong(3)), eventAt, cluster,
                CompactLine.whole(rs.getString(6), eventAt, cluster));
    }

    public static RunRow run(ResultSet rs) throws SQLException {
        return new RunRow(rs.getString(1), rs.getString(2), rs.getInt(3), rs.getString(4), rs.getString(5),
                runState(rs.getString(6)), rs.getBoolean(7), Times.fromNanos(rs.getLong(8)), instant(rs, 9), instant(rs, 10),
                rs.getString(11), rs.getString(12), rs.getString(13));
    }

    public static StepRow step(ResultSet rs) throws SQLException {
        return new StepRow(rs.getString(1), rs.getString(2), rs.getInt(3), stepState(rs.getString(4)), rs.getInt(5),
                instant(rs, 6), instant(rs, 7), rs.getString(8), rs.getString(9));
    }

    public static TimerRow timer(ResultSet rs) throws SQLException {
        return new TimerRow(rs.getString(1), Times.fromNanos(rs.getLong(2)), rs.getString(3));
    }

    public static ExclusionRow exclusion(ResultSet rs) throws SQLException {
        String node = rs.getString(2);
        return new ExclusionRow(rs.getString(1), WHOLE_CLUSTER.equals(node) ? null : node, rs.getString(3),
                rs.getString(4), Times.fromNanos(rs.getLong(5)), instant(rs, 6));
    }

    public static ApprovalRow approval(ResultSet rs) throws SQLException {
        return new ApprovalRow(rs.getString(1), rs.getString(2), rs.getString(3), rs.getString(4), rs.getString(5),
                Times.fromNanos(rs.getLong(6)), Times.fromNanos(rs.getLong(7)), approvalState(rs.getString(8)), rs.getString(9),
                instant(rs, 10), rs.getString(11));
    }

    /** The stored text of an approval's state as its {@link ApprovalState}; text that is none is refused. */
    public static ApprovalState approvalState(String text) {
        return ApprovalState.of(text).orElseThrow(() -> new IllegalArgumentException("ApprovalRow.state must be one of "
                + String.join(", ", ApprovalState.wireNames()) + ", got '" + text + "'"));
    }

    /** The stored text of a run's state as its {@link RunState}; text that is none is refused. */
    public static RunState runState(String text) {
        return RunState.of(text).orElseThrow(() -> new IllegalArgumentException("RunRow.state must be a run state such as running"
                + " or succeeded, got '" + text + "'"));
    }

    /** The stored text of a step's state as its {@link StepState}; text that is none is refused. */
    public static StepState stepState(String text) {
        return StepState.of(text).orElseThrow(() -> new IllegalArgumentException("StepRow.state must be a step state such as"
                + " running or timed-out, got '" + text + "'"));
    }

    public static final String PAGE_COLUMNS = "id, channel, created_ns, payload, state, attempts, next_ns, last_answer, ended_ns";

    public static PageRow page(ResultSet rs) throws SQLException {
        return new PageRow(rs.getString(1), rs.getString(2), Times.fromNanos(rs.getLong(3)), rs.getString(4), rs.getString(5),
                rs.getInt(6), Times.fromNanos(rs.getLong(7)), rs.getString(8), instant(rs, 9));
    }

    public static LedgerEntry ledger(ResultSet rs) throws SQLException {
        return new LedgerEntry(rs.getLong(1), Times.fromNanos(rs.getLong(2)), rs.getString(3), rs.getString(4),
                rs.getString(5), rs.getString(6), rs.getString(7), rs.getString(8), rs.getString(9));
    }

    private static Instant instant(ResultSet rs, int column) throws SQLException {
        long nanos = rs.getLong(column);
        return rs.wasNull() ? null : Times.fromNanos(nanos);
    }
}
