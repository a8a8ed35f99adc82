package dev.tend.handover;

import java.util.List;
import java.util.Map;

/**
 * The handover report as CSV (RFC 4180: CRLF line ends, fields with a comma, quote or line
 * break quoted, quotes doubled): two tables, each with a header row, separated by one empty
 * line.
 *
 * <ol>
 * <li>Runs, one row per run in the period:
 *     {@code run,playbook,cluster,node,created_at,started_at,ended_at,state,note,actions}
 *     (times RFC 3339 UTC, empty when unknown; {@code actions} are the actions that
 *     succeeded, separated by {@code ;}).</li>
 * <li>Summary, one number or value per row: {@code metric,playbook,reason_code,value}.
 *     Rows with an empty playbook and reason code are fleet-wide: {@code period_since},
 *     {@code period_until}, {@code runs_started}, {@code runs_succeeded}, {@code runs_failed},
 *     {@code runs_cancelled}, {@code runs_shadowed}, {@code runs_stood_down}, {@code held}, {@code denied},
 *     {@code approvals_requested}, {@code approvals_pending}, {@code approvals_lapsed},
 *     {@code runs_needing_person}, {@code loops_stopped}, {@code brake_periods}, {@code brake_engaged_at_until},
 *     {@code ledger_entries}, {@code ledger_entries_in_period}, {@code ledger_head},
 *     {@code ledger_verified}, {@code ledger_first_broken_seq}, {@code ledger_verified_from_seq}. Then the same run metrics,
 *     {@code held} and {@code denied} per playbook, and {@code held} and {@code denied} per
 *     reason code (distinct candidates).</li>
 * </ol>
 */
public final class HandoverCsv {
    static final String RUN_HEADER = "run,playbook,cluster,node,created_at,started_at,ended_at,state,note,actions";
    static final String SUMMARY_HEADER = "metric,playbook,reason_code,value";
    private static final String EOL = "\r\n";

    private HandoverCsv() {
    }

    /** Both tables, runs first, separated by one empty line. */
    public static String render(HandoverReport r) {
        return runs(r) + EOL + summary(r);
    }

    /** The runs table alone (one table, as a spreadsheet or a CSV reader expects a file to hold). */
    public static String runs(HandoverReport r) {
        StringBuilder out = new StringBuilder();
        out.append(RUN_HEADER).append(EOL);
        for (RunLine x : r.runs()) {
            row(out, x.run(), x.playbook(), x.cluster(), x.node(), time(x.createdAt()), time(x.startedAt()),
                    time(x.endedAt()), x.state(), x.note(), String.join(";", x.actions()));
        }
        return out.toString();
    }

    /** The summary table alone. */
    public static String summary(HandoverReport r) {
        StringBuilder out = new StringBuilder();
        out.append(SUMMARY_HEADER).append(EOL);
        fleet(out, "period_since", time(r.period().since()));
        fleet(out, "period_until", time(r.period().until()));
        counts(out, null, r.totals());
        fleet(out, "approvals_requested", r.approvalsRequested());
        fleet(out, "approvals_pending", r.pendingApprovals().size());
        fleet(out, "approvals_lapsed", r.lapsedApprovals().size());
        fleet(out, "runs_needing_person", r.runsNeedingPerson().size());
        fleet(out, "loops_stopped", r.loopsStopped().size());
        fleet(out, "pages_delivered", r.deliveredPages().size());
        fleet(out, "pages_failed", r.failedPages().size());
        fleet(out, "brake_periods", r.brakePeriods().size());
        fleet(out, "brake_engaged_at_until", r.brakeStillEngaged().isPresent());
        LedgerStatus l = r.ledger();
        fleet(out, "ledger_entries", l.entries());
        fleet(out, "ledger_entries_in_period", l.entriesInPeriod());
        fleet(out, "ledger_head", l.headHash());
        fleet(out, "ledger_verified", l.verified());
        fleet(out, "ledger_first_broken_seq", l.firstBrokenSeq());
        fleet(out, "ledger_verified_from_seq", l.verifiedFrom());
        for (Map.Entry<String, RunCounts> e : r.byPlaybook().entrySet()) counts(out, e.getKey(), e.getValue());
        for (ReasonCount c : r.byReason()) {
            row(out, "held", null, c.code(), Integer.toString(c.held()));
            row(out, "denied", null, c.code(), Integer.toString(c.denied()));
        }
        return out.toString();
    }

    private static void counts(StringBuilder out, String playbook, RunCounts c) {
        List<Object[]> rows = List.of(new Object[]{"runs_started", c.started()}, new Object[]{"runs_succeeded", c.succeeded()},
                new Object[]{"runs_failed", c.failed()}, new Object[]{"runs_cancelled", c.cancelled()},
                new Object[]{"runs_shadowed", c.shadowed()}, new Object[]{"runs_stood_down", c.stoodDown()},
                new Object[]{"held", c.held()}, new Object[]{"denied", c.denied()});
        for (Object[] m : rows) row(out, (String) m[0], playbook, null, m[1].toString());
    }

    private static void fleet(StringBuilder out, String metric, Object value) {
        row(out, metric, null, null, String.valueOf(value));
    }

    private static void row(StringBuilder out, String... fields) {
        for (int i = 0; i < fields.length; i++) {
            if (i > 0) out.append(',');
            out.append(field(fields[i]));
        }
        out.append(EOL);
    }

    /** One field: empty for null; quoted when it holds a comma, a quote or a line break (RFC 4180 section 2). */
    static String field(String s) {
        if (s == null) return "";
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) return s;
        return '"' + s.replace("\"", "\"\"") + '"';
    }

    private static String time(java.time.Instant t) {
        return t == null ? null : TimeText.at(t);
    }
}
