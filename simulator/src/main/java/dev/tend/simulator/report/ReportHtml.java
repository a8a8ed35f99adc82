package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import dev.tend.shared.time.Durations;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.function.Function;

import static dev.tend.simulator.report.Html.esc;
import static dev.tend.simulator.report.ReportText.time;

/**
 * The HTML form of a replay report: one self-contained page (inline style, an inline SVG
 * timeline, no script and no external asset) with the totals, the timeline, runs by
 * playbook, holds and denials by reason, brake periods, notifications, hidden events and
 * the runs. Long tables are cut at {@value #ROWS} rows with a count of the rest.
 */
public final class ReportHtml {
    static final int ROWS = 200;

    private ReportHtml() {
    }

    public static String render(ReplayReport r) {
        RecordingInfo rec = r.recording();
        StringBuilder sb = Html.page("replay of " + rec.name(), rec.description());
        sb.append("<p class=\"muted\">").append(t(rec.from())).append(" to ").append(t(rec.horizon())).append(esc(" (UTC), " + rec.events()
                + " events, " + rec.badLines() + " bad lines skipped, " + rec.lateEvents() + " late; seed " + r.replay().seed()
                + "; fleet " + r.replay().fleet() + ", " + r.replay().clusters() + " clusters")).append("</p>\n");
        tiles(sb, r.summary());
        sb.append("<h2>Timeline</h2>\n<p class=\"muted\">Runs as bars per cluster (green succeeded, red failed, amber not"
                + " ended or cancelled, grey shadow mode); fleet brake periods shaded; below, the most clusters unhealthy at once per "
                + esc(Durations.format(r.replay().healthInterval())) + ".</p>\n");
        sb.append(Timeline.svg(r));
        body(sb, r);
        return Html.end(sb);
    }

    static void tiles(StringBuilder sb, Summary s) {
        sb.append("<div class=\"tiles\">");
        Html.tile(sb, "runs started", s.runsStarted(), null);
        Html.tile(sb, "succeeded", s.runsSucceeded(), s.runsSucceeded() > 0 ? "ok" : null);
        Html.tile(sb, "failed", s.runsFailed(), s.runsFailed() > 0 ? "bad" : null);
        Html.tile(sb, "stood down", s.runsStoodDown(), null);
        Html.tile(sb, "held (decisions)", s.held(), null);
        Html.tile(sb, "denied (decisions)", s.denied(), null);
        Html.tile(sb, "approvals requested", s.approvalsRequested(), null);
        Html.tile(sb, "most runs at once", s.maxConcurrentRuns(), null);
        Html.tile(sb, "fleet brake", s.brakeEngaged() ? "engaged" : "never", s.brakeEngaged() ? "bad" : null);
        Html.tile(sb, "events hidden", s.hiddenEvents(), null);
        sb.append("</div>\n");
    }

    private static void body(StringBuilder sb, ReplayReport r) {
        Map<String, Tallies.RunCounts> byPlaybook = Tallies.runsByPlaybook(r.runs());
        if (!byPlaybook.isEmpty()) {
            sb.append("<h2>Runs by playbook</h2>\n<table><tr><th>playbook</th><th>runs</th><th>succeeded</th><th>failed</th><th>other</th></tr>\n");
            byPlaybook.forEach((p, c) -> sb.append("<tr><td>").append(esc(p)).append("</td><td class=\"n\">").append(c.runs())
                    .append("</td><td class=\"n\">").append(c.succeeded()).append("</td><td class=\"n\">").append(c.failed())
                    .append("</td><td class=\"n\">").append(c.other()).append("</td></tr>\n"));
            sb.append("</table>\n");
        }
        reasons(sb, r, "Holds by reason", Verdict.HOLD);
        reasons(sb, r, "Denials by reason", Verdict.DENY);
        if (!r.brakePeriods().isEmpty()) {
            sb.append("<h2>Fleet brake</h2>\n<table><tr><th>engaged</th><th>released</th><th>for</th><th>by</th><th>reason</th></tr>\n");
            for (BrakePeriod b : r.brakePeriods()) {
                sb.append("<tr><td>").append(t(b.engagedAt())).append("</td><td>")
                        .append(b.releasedAt() == null ? "still engaged" : t(b.releasedAt())).append("</td><td>")
                        .append(b.releasedAt() == null ? "" : Durations.format(Duration.between(b.engagedAt(), b.releasedAt())))
                        .append("</td><td>").append(esc(b.engagedBy())).append("</td><td>").append(Html.text(b.reason())).append("</td></tr>\n");
            }
            sb.append("</table>\n");
        }
        table(sb, "Notifications", r.notifications(), "<th>at</th><th>channel</th><th>message</th>",
                n -> "<td>" + t(n.at()) + "</td><td>" + esc(n.channel()) + "</td><td>" + Html.text(n.message()) + "</td>");
        if (!r.masks().isEmpty()) {
            sb.append("<h2>Events hidden</h2>\n<p>").append(r.summary().hiddenEvents()).append(" recorded events were hidden from the"
                    + " engine: a simulated action had cleared the signal, and the recording (made where nobody fixed it) kept"
                    + " reporting it until it showed it clear.</p>\n");
            table(sb, null, r.masks(), "<th>hidden</th><th>target</th><th>signal</th><th>cleared at</th><th>by run</th><th>until</th>",
                    m -> "<td class=\"n\">" + m.hiddenEvents() + "</td><td>" + esc(m.node() == null ? m.cluster().value()
                            : m.cluster() + "/" + m.node()) + "</td><td>" + esc(m.signal().value()) + "</td><td>" + t(m.maskedAt())
                            + "</td><td>" + esc(m.run() + " (" + m.action() + ")") + "</td><td>"
                            + (m.liftedAt() == null ? "end of recording" : t(m.liftedAt())) + "</td>");
        }
        table(sb, "Runs", r.runs(), "<th>run</th><th>playbook</th><th>target</th><th>started</th><th>ended</th><th>outcome</th><th>steps</th>",
                run -> "<td>" + esc(run.run()) + "</td><td>" + esc(run.playbook().value()) + "</td><td>" + esc(run.target())
                        + "</td><td>" + t(run.startedAt()) + "</td><td>" + (run.endedAt() == null ? "not ended" : t(run.endedAt()))
                        + "</td><td class=\"" + (run.outcome().equals("succeeded") ? "ok" : run.outcome().equals("failed") ? "bad" : "muted")
                        + "\">" + esc(run.outcome()) + "</td><td>" + esc(steps(run)) + "</td>");
        if (!r.assumptions().isEmpty()) {
            sb.append("<h2>Assumptions</h2>\n<ul>\n");
            for (String a : r.assumptions()) sb.append("<li>").append(esc(a)).append("</li>\n");
            sb.append("</ul>\n");
        }
    }

    private static String steps(RunEntry run) {
        StringBuilder s = new StringBuilder();
        for (StepEntry st : run.steps()) {
            if (s.length() > 0) s.append(", ");
            s.append(st.step()).append(' ').append(st.state());
            if (st.attempt() > 1) s.append(" (attempt ").append(st.attempt()).append(')');
        }
        return s.toString();
    }

    private static void reasons(StringBuilder sb, ReplayReport r, String title, Verdict verdict) {
        Map<ReasonCode, Long> counts = Tallies.reasons(r.decisions(), verdict);
        if (counts.isEmpty()) return;
        sb.append("<h2>").append(esc(title)).append("</h2>\n<table><tr><th>reason code</th><th>meaning</th><th>decisions</th>"
                + "<th>targets (the first ones and how many)</th></tr>\n");
        counts.forEach((c, n) -> {
            sb.append("<tr><td><code>").append(c.code()).append("</code></td><td>").append(esc(c.meaning()))
                    .append("</td><td class=\"n\">").append(n).append("</td><td>")
                    .append(esc(ReportText.targets(r.decisions(), verdict, c)));
            if (c == ReasonCode.APPROVAL_REQUIRED) {
                sb.append("<br><span class=\"muted\">").append(esc(ReportText.approvalNote(r.summary().approvalsRequested())))
                        .append("</span>");
            }
            sb.append("</td></tr>\n");
        });
        sb.append("</table>\n");
    }

    /** A time that never breaks across lines (RFC 3339, UTC). */
    static String t(java.time.Instant at) {
        return "<span class=\"t\">" + time(at) + "</span>";
    }

    static <T> void table(StringBuilder sb, String title, List<T> items, String header, Function<T, String> row) {
        if (items.isEmpty()) return;
        if (title != null) sb.append("<h2>").append(esc(title)).append("</h2>\n");
        sb.append("<table><tr>").append(header).append("</tr>\n");
        int n = Math.min(items.size(), ROWS);
        for (int i = 0; i < n; i++) sb.append("<tr>").append(row.apply(items.get(i))).append("</tr>\n");
        sb.append("</table>\n");
        if (items.size() > n) sb.append("<p class=\"muted\">... and ").append(items.size() - n).append(" more; the JSON report lists all.</p>\n");
    }
}
