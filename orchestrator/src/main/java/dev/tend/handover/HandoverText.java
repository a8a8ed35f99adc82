package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import java.util.List;
import java.util.Map;

/**
 * The handover report as plain text for one screen: the headline numbers first, then what
 * needs attention (a ledger that failed verify, pending approvals, runs waiting for a person,
 * targets stopped as loops, the brake still engaged), then the breakdowns. Long lists are cut
 * with a count of the rest; the HTML rendering lists everything. Times are UTC.
 */
public final class HandoverText {
    /** How many lines a list shows before it says how many more there are. */
    static final int LIST_LIMIT = 8;

    private HandoverText() {
    }

    public static String render(HandoverReport r) {
        StringBuilder out = new StringBuilder();
        ReportPeriod p = r.period();
        RunCounts t = r.totals();
        line(out, "Handover %s to %s (%s)", TimeText.at(p.since()), TimeText.at(p.until()), TimeText.span(p.length()));
        out.append('\n');
        line(out, "Runs       %d started, %d succeeded, %d failed, %d cancelled, %d shadowed, %d stood down",
                t.started(), t.succeeded(), t.failed(), t.cancelled(), t.shadowed(), t.stoodDown());
        line(out, "Held       %d held, %d denied (distinct candidates)", t.held(), t.denied());
        line(out, "Approvals  %d asked, %d pending, %d lapsed", r.approvalsRequested(), r.pendingApprovals().size(),
                r.lapsedApprovals().size());
        line(out, "Brake      %s", brakeHeadline(r));
        line(out, "Pages      %d delivered, %d given up", r.deliveredPages().size(), r.failedPages().size());
        LedgerStatus l = r.ledger();
        line(out, "Ledger     %d entries (%d in the period), verify %s%s, head %s", l.entries(), l.entriesInPeriod(),
                l.verified() ? "ok" : "FAILED at entry " + l.firstBrokenSeq(),
                l.verifiedWhole() ? "" : " (entries " + l.verifiedFrom() + " on; `tend audit verify` for all)", l.headHash());
        out.append('\n');
        attention(out, r);
        byPlaybook(out, r.byPlaybook());
        byReason(out, r.byReason());
        nodes(out, r.nodesRemediated());
        brakes(out, r);
        lapsed(out, r);
        pages(out, r);
        return out.toString();
    }

    private static String brakeHeadline(HandoverReport r) {
        if (r.brakeStillEngaged().isPresent()) {
            BrakePeriod b = r.brakeStillEngaged().get();
            return "ENGAGED since " + TimeText.at(b.engagedAt()) + " by " + b.engagedBy() + " (" + r.brakePeriods().size()
                    + " period(s) in all)";
        }
        return r.brakePeriods().isEmpty() ? "not engaged" : r.brakePeriods().size() + " period(s), released";
    }

    private static void attention(StringBuilder out, HandoverReport r) {
        if (!r.needsAttention()) {
            line(out, "Nothing needs attention.");
            out.append('\n');
            return;
        }
        line(out, "Needs attention");
        LedgerStatus l = r.ledger();
        if (!l.verified()) {
            line(out, "  ! ledger verify failed: %s; the numbers below come from a ledger changed after it was written", l.verifyMessage());
        }
        if (l.unreadable() > 0) line(out, "  ! %d entries of the period are not readable and were left out", l.unreadable());
        List<ApprovalLine> pending = r.pendingApprovals();
        for (int i = 0; i < pending.size() && i < LIST_LIMIT; i++) {
            ApprovalLine a = pending.get(i);
            line(out, "  ! approval pending  %s  %s  %s  asked %s, %s %s", a.run(), a.playbook(), a.target(),
                    TimeText.at(a.requestedAt()), a.isOverdueAt(r.period().until()) ? "expired unanswered at" : "expires",
                    TimeText.at(a.expiresAt()));
        }
        more(out, pending.size());
        List<RunLine> human = r.runsNeedingPerson();
        for (int i = 0; i < human.size() && i < LIST_LIMIT; i++) {
            RunLine x = human.get(i);
            line(out, "  ! needs a person    %s  %s  %s  %s", x.run(), x.playbook(), x.target(), x.note() == null ? "" : x.note());
        }
        more(out, human.size());
        List<LoopStop> loops = r.loopsStopped();
        for (int i = 0; i < loops.size() && i < LIST_LIMIT; i++) {
            LoopStop x = loops.get(i);
            line(out, "  ! loop stopped      %s  %s  since %s; automation stays off this target until a person clears it",
                    x.playbook(), x.target(), TimeText.at(x.stoppedAt()));
        }
        more(out, loops.size());
        r.brakeStillEngaged().ifPresent(b -> line(out, "  ! fleet brake       engaged since %s by %s%s; automatic starts are on hold",
                TimeText.at(b.engagedAt()), b.engagedBy(), b.reason() == null ? "" : ": " + b.reason()));
        List<PageLine> failed = r.failedPages();
        for (int i = 0; i < failed.size() && i < LIST_LIMIT; i++) {
            PageLine p = failed.get(i);
            line(out, "  ! page not delivered %s to %s, given up %s after %d attempt%s: %s", p.id(), p.channel(), TimeText.at(p.at()),
                    p.attempts(), p.attempts() == 1 ? "" : "s", p.answer() == null ? "" : p.answer());
        }
        more(out, failed.size());
        out.append('\n');
    }

    private static void pages(StringBuilder out, HandoverReport r) {
        if (r.pages().isEmpty()) return;
        line(out, "Pages sent and given up");
        List<PageLine> all = r.pages();
        for (int i = 0; i < all.size() && i < LIST_LIMIT; i++) {
            PageLine p = all.get(i);
            line(out, "  %s  %-9s %-10s %-20s %s", TimeText.at(p.at()), p.outcome(), p.channel(), p.kind() == null ? "" : p.kind(), p.id());
        }
        more(out, all.size());
        out.append('\n');
    }

    private static void byPlaybook(StringBuilder out, Map<String, RunCounts> byPlaybook) {
        if (byPlaybook.isEmpty()) return;
        int w = Math.max(20, byPlaybook.keySet().stream().mapToInt(String::length).max().orElse(0));
        line(out, "By playbook%s  started succeeded failed cancelled shadowed stood-down held denied", " ".repeat(w - 9));
        byPlaybook.forEach((name, c) -> line(out, "  %-" + w + "s %8d %9d %6d %9d %8d %10d %4d %6d", name, c.started(), c.succeeded(),
                c.failed(), c.cancelled(), c.shadowed(), c.stoodDown(), c.held(), c.denied()));
        out.append('\n');
    }

    private static void byReason(StringBuilder out, List<ReasonCount> byReason) {
        if (byReason.isEmpty()) return;
        line(out, "Held and denied by reason code (distinct candidates)");
        for (ReasonCount c : byReason) line(out, "  %-18s held %-4d denied %d", c.code(), c.held(), c.denied());
        out.append('\n');
    }

    private static void nodes(StringBuilder out, Map<String, List<RunLine>> nodes) {
        if (nodes.isEmpty()) return;
        line(out, "Nodes remediated (runs that ended succeeded, with the actions that succeeded)");
        nodes.forEach((playbook, runs) -> {
            StringBuilder sb = new StringBuilder();
            for (int i = 0; i < runs.size() && i < LIST_LIMIT; i++) {
                RunLine x = runs.get(i);
                if (i > 0) sb.append(", ");
                sb.append(x.target());
                if (!x.actions().isEmpty()) sb.append(" (").append(String.join(", ", x.actions())).append(')');
            }
            if (runs.size() > LIST_LIMIT) sb.append(", and ").append(runs.size() - LIST_LIMIT).append(" more");
            line(out, "  %s (%d): %s", playbook, runs.size(), sb);
        });
        out.append('\n');
    }

    private static void brakes(StringBuilder out, HandoverReport r) {
        if (r.brakePeriods().isEmpty()) return;
        line(out, "Fleet brake periods");
        List<BrakePeriod> list = r.brakePeriods();
        for (int i = 0; i < list.size() && i < LIST_LIMIT; i++) {
            BrakePeriod b = list.get(i);
            String end = b.isStillEngaged() ? ", still engaged"
                    : " to " + TimeText.near(b.releasedAt(), b.engagedAt()) + " ("
                    + TimeText.span(java.time.Duration.between(b.engagedAt(), b.releasedAt())) + ")";
            line(out, "  %s%s  engaged by %s%s%s", TimeText.at(b.engagedAt()), end, b.engagedBy(),
                    b.reason() == null ? "" : ": " + b.reason(),
                    b.isStillEngaged() ? "" : "; released by " + b.releasedBy() + (b.releaseReason() == null ? "" : ": " + b.releaseReason()));
        }
        more(out, list.size());
        out.append('\n');
    }

    private static void lapsed(StringBuilder out, HandoverReport r) {
        List<ApprovalLine> lapsed = r.lapsedApprovals();
        if (lapsed.isEmpty()) return;
        line(out, "Approvals lapsed unanswered");
        for (int i = 0; i < lapsed.size() && i < LIST_LIMIT; i++) {
            ApprovalLine a = lapsed.get(i);
            line(out, "  %s  %s  %s  asked %s, lapsed %s", a.run(), a.playbook(), a.target(), TimeText.at(a.requestedAt()),
                    TimeText.at(a.decidedAt()));
        }
        more(out, lapsed.size());
        out.append('\n');
    }

    private static void more(StringBuilder out, int size) {
        if (size > LIST_LIMIT) line(out, "    and %d more (--format html lists all)", size - LIST_LIMIT);
    }

    private static void line(StringBuilder out, String format, Object... args) {
        out.append(String.format(java.util.Locale.ROOT, format, args)).append('\n');
    }
}
