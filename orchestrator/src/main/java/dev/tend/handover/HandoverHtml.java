package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.text.HtmlText;

import java.util.List;
import java.util.Map;

/**
 * The handover report as one self-contained HTML page: styles inline, the timeline as inline
 * SVG ({@link TimelineSvg}), no script, font, image or link to anything outside the page, so
 * it works offline and can be mailed or attached. The order follows the text rendering:
 * headline numbers, what needs attention, the timeline, then the breakdowns and full lists.
 * Every piece of ledger text is escaped. The page is also well-formed XML. Times are UTC.
 */
public final class HandoverHtml {
    private static final String STYLE = """
            body { font-family: system-ui, sans-serif; color: #1f2a30; background: #f6f5f1; margin: 0; }
            main { max-width: 1000px; margin: 0 auto; padding: 16px 20px 40px; }
            h1 { font-size: 1.4em; margin: 8px 0 2px; }
            h2 { font-size: 1.05em; margin: 26px 0 8px; border-bottom: 1px solid #cfd6d2; padding-bottom: 3px; }
            .period { color: #55636b; margin: 0 0 14px; }
            .cards { display: flex; flex-wrap: wrap; gap: 8px; margin: 0; }
            .card { background: #fff; border: 1px solid #d9ddd8; border-radius: 6px; padding: 6px 12px; min-width: 92px; }
            .card dt { font-size: .78em; color: #55636b; }
            .card dd { margin: 0; font-size: 1.35em; font-weight: 600; }
            .card.bad dd { color: #a23b2a; }
            .attention { background: #fff4e5; border: 1px solid #e8b26a; border-radius: 6px; padding: 8px 14px; }
            .attention li { margin: 3px 0; }
            .calm { color: #2f6b3b; }
            table { border-collapse: collapse; background: #fff; font-size: .9em; width: 100%; }
            th, td { border: 1px solid #dde1dc; padding: 3px 7px; text-align: left; vertical-align: top; }
            th { background: #eceee9; font-weight: 600; }
            td.n { text-align: right; font-variant-numeric: tabular-nums; }
            code { font-size: .9em; word-break: break-all; }
            .ok { color: #2f6b3b; font-weight: 600; }
            .failed-verify { color: #a23b2a; font-weight: 600; }
            svg.timeline { background: #fff; border: 1px solid #d9ddd8; max-width: 100%; height: auto; }
            .note { color: #55636b; font-size: .88em; margin: 4px 0 8px; }
            ul.legend { list-style: none; padding: 0; margin: 6px 0 0; display: flex; flex-wrap: wrap; gap: 4px 16px; font-size: .82em; color: #3c4a52; }
            ul.legend li { display: flex; align-items: center; gap: 5px; white-space: nowrap; }
            svg .row { fill: #f3f4f1; }
            svg .label, svg .tick, svg .legend { font-size: 11px; fill: #3c4a52; }
            svg .tick { text-anchor: middle; }
            svg .tick.utc { text-anchor: start; }
            svg .grid { stroke: #e3e6e1; stroke-width: 1; }
            svg .brake { fill: #d9534f; fill-opacity: .16; }
            svg .run { stroke: #1f2a30; stroke-width: .4; }
            svg .succeeded { fill: #4c9a5b; }
            svg .failed { fill: #c0392b; }
            svg .cancelled { fill: #9aa3a8; }
            svg .shadowed { fill: #fff; stroke: #7d6aa8; stroke-dasharray: 3 2; }
            svg .stood-down { fill: #c9b458; }
            svg .running, svg .approved { fill: #3f78b5; }
            svg .paused { fill: #d8b13a; }
            svg .needs-human { fill: #e07b24; }
            svg .awaiting-approval { fill: #fff; stroke: #e07b24; stroke-dasharray: 3 2; }
            svg .ask { fill: #fff; stroke: #b5651d; stroke-width: 1.5; }
            svg .ask.pending { fill: #e07b24; }
            svg circle.lapsed, svg circle.rejected, svg circle.withdrawn { fill: #c0392b; }
            svg circle.approved { fill: #4c9a5b; }
            footer { margin-top: 28px; color: #6b777d; font-size: .82em; }
            """;

    private HandoverHtml() {
    }

    public static String render(HandoverReport r) {
        ReportPeriod p = r.period();
        StringBuilder s = new StringBuilder(16_384);
        s.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n")
                .append("<title>tend handover ").append(TimeText.at(p.since())).append(" to ").append(TimeText.at(p.until()))
                .append("</title>\n<style>\n").append(STYLE).append("</style>\n</head>\n<body>\n<main>\n");
        s.append("<h1>Handover</h1>\n<p class=\"period\">").append(TimeText.at(p.since())).append(" to ")
                .append(TimeText.at(p.until())).append(" (").append(TimeText.span(p.length())).append(", UTC)</p>\n");
        cards(s, r);
        attention(s, r);
        s.append("<h2>Timeline</h2>\n");
        ReportPeriod w = TimelineSvg.window(r);
        s.append("<p class=\"note\">").append(w.equals(p) ? "The whole period, " + TimeText.at(p.since()) + " to " + TimeText.at(p.until())
                : "Zoomed to where activity is: " + TimeText.at(w.since()) + " to " + TimeText.at(w.until()) + " (" + TimeText.span(w.length())
                + " of the " + TimeText.span(p.length()) + " period)")
                .append(". Another span: <code>tend handover --since T --until T</code>. Point at a bar for its run.</p>\n")
                .append(TimelineSvg.render(r));
        byPlaybook(s, r.byPlaybook());
        byReason(s, r.byReason());
        nodes(s, r.nodesRemediated());
        brakes(s, r.brakePeriods());
        approvals(s, r);
        runs(s, r.runs());
        ledger(s, r.ledger());
        s.append("<footer>Computed from the audit ledger, the record of truth: every count is of ledger entries in the period.")
                .append(" Held and denied count distinct candidates (playbook, cluster, node).</footer>\n");
        s.append("</main>\n</body>\n</html>\n");
        return s.toString();
    }

    private static void cards(StringBuilder s, HandoverReport r) {
        RunCounts t = r.totals();
        s.append("<dl class=\"cards\">\n");
        card(s, "started", t.started(), false);
        card(s, "succeeded", t.succeeded(), false);
        card(s, "failed", t.failed(), t.failed() > 0);
        card(s, "cancelled", t.cancelled(), false);
        card(s, "shadowed", t.shadowed(), false);
        card(s, "stood down", t.stoodDown(), false);
        card(s, "held", t.held(), false);
        card(s, "denied", t.denied(), false);
        card(s, "approvals pending", r.pendingApprovals().size(), !r.pendingApprovals().isEmpty());
        card(s, "approvals lapsed", r.lapsedApprovals().size(), false);
        card(s, "need a person", r.runsNeedingPerson().size(), !r.runsNeedingPerson().isEmpty());
        s.append("<div class=\"card").append(r.brakeStillEngaged().isPresent() ? " bad" : "").append("\"><dt>fleet brake</dt><dd>")
                .append(r.brakeStillEngaged().isPresent() ? "engaged" : "released").append("</dd></div>\n");
        s.append("<div class=\"card").append(r.ledger().verified() ? "" : " bad").append("\"><dt>ledger verify</dt><dd>")
                .append(r.ledger().verified() ? "ok" : "failed").append("</dd></div>\n");
        s.append("</dl>\n");
    }

    private static void card(StringBuilder s, String label, int n, boolean bad) {
        s.append("<div class=\"card").append(bad ? " bad" : "").append("\"><dt>").append(label).append("</dt><dd>").append(n)
                .append("</dd></div>\n");
    }

    private static void attention(StringBuilder s, HandoverReport r) {
        s.append("<h2>Needs attention</h2>\n");
        if (!r.needsAttention()) {
            s.append("<p class=\"calm\">Nothing needs attention.</p>\n");
            return;
        }
        s.append("<ul class=\"attention\">\n");
        LedgerStatus l = r.ledger();
        if (l.unreadable() > 0) {
            s.append("<li><strong>").append(l.unreadable()).append(" entries of the period are not readable</strong> and were left out</li>\n");
        }
        if (!l.verified()) {
            s.append("<li><strong>Ledger verify failed</strong> at entry ").append(l.firstBrokenSeq()).append(": ")
                    .append(esc(l.verifyMessage())).append(". The numbers here come from a ledger changed after it was written.</li>\n");
        }
        for (ApprovalLine a : r.pendingApprovals()) {
            s.append("<li><strong>Approval pending</strong> for ").append(esc(a.run())).append(' ').append(esc(a.playbook()))
                    .append(" on ").append(esc(a.target())).append(", asked ").append(TimeText.at(a.requestedAt()))
                    .append(a.isOverdueAt(r.period().until()) ? ", expired unanswered at " : ", expires ")
                    .append(TimeText.at(a.expiresAt())).append("</li>\n");
        }
        for (RunLine x : r.runsNeedingPerson()) {
            s.append("<li><strong>Needs a person</strong>: ").append(esc(x.run())).append(' ').append(esc(x.playbook()))
                    .append(" on ").append(esc(x.target())).append(x.note() == null ? "" : ": " + esc(x.note())).append("</li>\n");
        }
        for (LoopStop x : r.loopsStopped()) {
            s.append("<li><strong>Loop stopped</strong>: ").append(esc(x.playbook())).append(" on ").append(esc(x.target()))
                    .append(" since ").append(TimeText.at(x.stoppedAt()))
                    .append("; automation stays off this target until a person clears it</li>\n");
        }
        for (PageLine p : r.failedPages()) {
            s.append("<li><strong>Page not delivered</strong>: ").append(esc(p.id()))
                    .append(p.kind() == null ? "" : " (" + esc(p.kind()) + ")").append(" to ").append(esc(p.channel()))
                    .append(", given up ").append(TimeText.at(p.at())).append(p.answer() == null ? "" : ": " + esc(p.answer()))
                    .append("</li>\n");
        }
        r.brakeStillEngaged().ifPresent(b -> s.append("<li><strong>Fleet brake engaged</strong> since ")
                .append(TimeText.at(b.engagedAt())).append(" by ").append(esc(b.engagedBy()))
                .append(b.reason() == null ? "" : ": " + esc(b.reason())).append("; automatic starts are on hold</li>\n"));
        s.append("</ul>\n");
    }

    private static void byPlaybook(StringBuilder s, Map<String, RunCounts> byPlaybook) {
        s.append("<h2>By playbook</h2>\n");
        if (byPlaybook.isEmpty()) {
            s.append("<p>No playbook did anything in this period.</p>\n");
            return;
        }
        s.append("<table>\n<tr><th>playbook</th><th>started</th><th>succeeded</th><th>failed</th><th>cancelled</th>")
                .append("<th>shadowed</th><th>stood down</th><th>held</th><th>denied</th></tr>\n");
        byPlaybook.forEach((name, c) -> {
            s.append("<tr><td>").append(esc(name)).append("</td>");
            for (int n : new int[]{c.started(), c.succeeded(), c.failed(), c.cancelled(), c.shadowed(), c.stoodDown(), c.held(),
                    c.denied()}) {
                s.append("<td class=\"n\">").append(n).append("</td>");
            }
            s.append("</tr>\n");
        });
        s.append("</table>\n");
    }

    private static void byReason(StringBuilder s, List<ReasonCount> byReason) {
        if (byReason.isEmpty()) return;
        s.append("<h2>Held and denied by reason code</h2>\n<table>\n<tr><th>reason code</th><th>held</th><th>denied</th></tr>\n");
        for (ReasonCount c : byReason) {
            s.append("<tr><td><code>").append(esc(c.code())).append("</code></td><td class=\"n\">").append(c.held())
                    .append("</td><td class=\"n\">").append(c.denied()).append("</td></tr>\n");
        }
        s.append("</table>\n");
    }

    private static void nodes(StringBuilder s, Map<String, List<RunLine>> nodes) {
        if (nodes.isEmpty()) return;
        s.append("<h2>Nodes remediated</h2>\n<table>\n<tr><th>playbook</th><th>node</th><th>run</th><th>ended</th>")
                .append("<th>actions that succeeded</th></tr>\n");
        nodes.forEach((playbook, list) -> {
            for (RunLine x : list) {
                s.append("<tr><td>").append(esc(playbook)).append("</td><td>").append(esc(x.target())).append("</td><td>")
                        .append(esc(x.run())).append("</td><td>").append(TimeText.at(x.endedAt())).append("</td><td>")
                        .append(esc(String.join(", ", x.actions()))).append("</td></tr>\n");
            }
        });
        s.append("</table>\n");
    }

    private static void brakes(StringBuilder s, List<BrakePeriod> brakes) {
        if (brakes.isEmpty()) return;
        s.append("<h2>Fleet brake periods</h2>\n<table>\n<tr><th>engaged</th><th>by</th><th>why</th><th>released</th>")
                .append("<th>by</th><th>why</th></tr>\n");
        for (BrakePeriod b : brakes) {
            s.append("<tr><td>").append(TimeText.at(b.engagedAt())).append("</td><td>").append(esc(b.engagedBy()))
                    .append("</td><td>").append(esc(b.reason())).append("</td><td>")
                    .append(b.isStillEngaged() ? "<strong>still engaged</strong>" : TimeText.at(b.releasedAt()))
                    .append("</td><td>").append(esc(b.releasedBy())).append("</td><td>").append(esc(b.releaseReason()))
                    .append("</td></tr>\n");
        }
        s.append("</table>\n");
    }

    private static void approvals(StringBuilder s, HandoverReport r) {
        if (r.approvals().isEmpty()) return;
        s.append("<h2>Approvals</h2>\n<table>\n<tr><th>run</th><th>playbook</th><th>target</th><th>asked</th><th>expires</th>")
                .append("<th>state</th><th>settled</th><th>by</th></tr>\n");
        for (ApprovalLine a : r.approvals()) {
            s.append("<tr><td>").append(esc(a.run())).append("</td><td>").append(esc(a.playbook())).append("</td><td>")
                    .append(esc(a.target())).append("</td><td>").append(TimeText.at(a.requestedAt())).append("</td><td>")
                    .append(TimeText.at(a.expiresAt())).append("</td><td>").append(esc(a.state())).append("</td><td>")
                    .append(a.decidedAt() == null ? "" : TimeText.at(a.decidedAt())).append("</td><td>")
                    .append(esc(a.decidedBy())).append("</td></tr>\n");
        }
        s.append("</table>\n");
    }

    private static void runs(StringBuilder s, List<RunLine> runs) {
        s.append("<h2>Runs</h2>\n");
        if (runs.isEmpty()) {
            s.append("<p>No run was active in this period.</p>\n");
            return;
        }
        s.append("<table>\n<tr><th>run</th><th>playbook</th><th>target</th><th>started</th><th>ended</th><th>state</th>")
                .append("<th>note</th></tr>\n");
        for (RunLine x : runs) {
            s.append("<tr><td>").append(esc(x.run())).append("</td><td>").append(esc(x.playbook())).append("</td><td>")
                    .append(esc(x.target())).append("</td><td>").append(x.startedAt() == null ? "" : TimeText.at(x.startedAt()))
                    .append("</td><td>").append(x.endedAt() == null ? "" : TimeText.at(x.endedAt())).append("</td><td>")
                    .append(esc(x.state())).append("</td><td>").append(esc(x.note())).append("</td></tr>\n");
        }
        s.append("</table>\n");
    }

    private static void ledger(StringBuilder s, LedgerStatus l) {
        s.append("<h2>Ledger</h2>\n<p>").append(l.entries()).append(" entries, ").append(l.entriesInPeriod())
                .append(" in this period. Verify: ")
                .append(l.verified() ? "<span class=\"ok\">ok</span>" : "<span class=\"failed-verify\">failed at entry "
                        + l.firstBrokenSeq() + "</span>")
                .append(" (").append(esc(l.verifyMessage())).append(").")
                .append(l.verifiedWhole() ? "" : " Entries before " + l.verifiedFrom()
                        + " were not read for this report; <code>tend audit verify</code> checks the whole chain.")
                .append("</p>\n<p>Head hash: <code>").append(l.headHash())
                .append("</code></p>\n");
        if (l.unreadable() > 0) {
            s.append("<p class=\"failed-verify\">").append(l.unreadable()).append(" entries of the period are not readable and were left out.</p>\n");
        }
    }

    /** {@link HtmlText#escape}: text safe for element content and quoted attributes; "" for null. */
    static String esc(String text) {
        return HtmlText.escape(text);
    }
}
