package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import dev.tend.shared.time.Durations;
import dev.tend.shared.wire.Rfc3339;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The text form of a replay report: what an operator needs to know about what would have
 * happened, in about one screenful. Totals first, then runs by playbook, holds and denials
 * by reason (each code with its meaning and first targets), brake periods, notifications,
 * events hidden by the replay's simulated fixes, and the first runs; long lists
 * are cut with a count of what was left out (the JSON form has everything).
 */
public final class ReportText {
    static final int LISTED = 8;
    /** Targets named beside each reason. */
    static final int TARGETS = 3;

    private ReportText() {
    }

    public static String render(ReplayReport r) {
        StringBuilder sb = new StringBuilder();
        RecordingInfo rec = r.recording();
        Summary s = r.summary();
        sb.append("replay of ").append(rec.name());
        if (rec.description() != null) sb.append(": ").append(rec.description());
        sb.append('\n');
        sb.append("  ").append(time(rec.from())).append(" to ").append(time(rec.horizon())).append(", ")
                .append(rec.events()).append(" events (").append(rec.badLines()).append(" bad lines skipped, ")
                .append(rec.lateEvents()).append(" late), seed ").append(r.replay().seed()).append(", fleet ")
                .append(r.replay().fleet()).append(" (").append(r.replay().clusters()).append(" clusters)\n");
        badLines(sb, rec);
        sb.append('\n');

        sb.append("what would have happened\n");
        sb.append(String.format(Locale.ROOT, "  runs started       %d (%d succeeded, %d failed, %d unfinished%s)\n", s.runsStarted(),
                s.runsSucceeded(), s.runsFailed(), s.runsUnfinished(),
                s.runsStoodDown() == 0 ? "" : ", " + s.runsStoodDown() + " stood down: no longer needed before an action step"));
        sb.append(String.format(Locale.ROOT, "  decisions          %d held, %d denied, %d approvals requested\n",
                s.held(), s.denied(), s.approvalsRequested()));
        sb.append(String.format(Locale.ROOT, "  most runs at once  %d\n", s.maxConcurrentRuns()));
        sb.append(String.format(Locale.ROOT, "  fleet brake        %s\n", s.brakeEngaged()
                ? "engaged " + r.brakePeriods().size() + (r.brakePeriods().size() == 1 ? " time" : " times") : "never engaged"));
        sb.append(String.format(Locale.ROOT, "  events hidden      %d%s\n", s.hiddenEvents(), s.hiddenEvents() == 0 ? ""
                : " (a simulated fix had cleared the signal; the recording went on reporting it)"));

        Map<String, Tallies.RunCounts> byPlaybook = Tallies.runsByPlaybook(r.runs());
        if (!byPlaybook.isEmpty()) {
            sb.append("\nruns by playbook\n");
            byPlaybook.forEach((p, c) -> sb.append(String.format(Locale.ROOT, "  %-34s %4d runs: %d succeeded, %d failed, %d other\n",
                    p, c.runs(), c.succeeded(), c.failed(), c.other())));
        }
        reasons(sb, r, Verdict.HOLD, "holds by reason (decisions naming it)");
        reasons(sb, r, Verdict.DENY, "denials by reason");

        if (!r.brakePeriods().isEmpty()) {
            sb.append("\nfleet brake\n");
            for (BrakePeriod b : r.brakePeriods()) {
                sb.append("  ").append(time(b.engagedAt())).append(" to ")
                        .append(b.releasedAt() == null ? "the end (still engaged)" : time(b.releasedAt()));
                if (b.releasedAt() != null) sb.append(" (").append(Durations.format(Duration.between(b.engagedAt(), b.releasedAt()))).append(')');
                sb.append(", ").append(b.engagedBy()).append(": ").append(b.reason()).append('\n');
            }
        }
        if (!r.notifications().isEmpty()) {
            Map<String, Integer> byChannel = Tallies.notificationsByChannel(r.notifications());
            sb.append("\nnotifications: ").append(r.notifications().size()).append(" (");
            StringBuilder ch = new StringBuilder();
            byChannel.forEach((c, n) -> ch.append(ch.length() > 0 ? ", " : "").append(c).append(' ').append(n));
            sb.append(ch).append(")\n");
            list(sb, r.notifications(), n -> time(n.at()) + " " + n.channel() + ": " + n.message());
        }
        if (!r.masks().isEmpty()) {
            sb.append("\nevents hidden: ").append(s.hiddenEvents()).append(" recorded events hidden after ")
                    .append(r.masks().size()).append(r.masks().size() == 1 ? " simulated fix\n" : " simulated fixes\n");
            list(sb, r.masks(), m -> m.hiddenEvents() + " hidden: " + m.reason());
        }
        if (!r.runs().isEmpty()) {
            sb.append("\nruns\n");
            list(sb, r.runs(), run -> String.format(Locale.ROOT, "%s %-28s %-20s %s to %s %s", run.run(), run.playbook(), run.target(),
                    time(run.startedAt()), run.endedAt() == null ? "(not ended)" : time(run.endedAt()), run.outcome()));
        }
        if (!r.assumptions().isEmpty()) {
            sb.append("\nassumptions\n");
            for (String a : r.assumptions()) sb.append("  - ").append(a).append('\n');
        }
        return sb.toString();
    }

    private static void reasons(StringBuilder sb, ReplayReport r, Verdict verdict, String title) {
        Map<ReasonCode, Long> counts = Tallies.reasons(r.decisions(), verdict);
        if (counts.isEmpty()) return;
        sb.append('\n').append(title).append(", with the first targets\n");
        counts.forEach((c, n) -> {
            sb.append(String.format(Locale.ROOT, "  %-18s %6d  %s\n", c.code(), n, c.meaning()));
            sb.append(String.format(Locale.ROOT, "  %-18s %6s  %s\n", "", "", targets(r.decisions(), verdict, c)));
            if (c == ReasonCode.APPROVAL_REQUIRED) {
                sb.append(String.format(Locale.ROOT, "  %-18s %6s  %s\n", "", "", approvalNote(r.summary().approvalsRequested())));
            }
        });
    }

    /** How many targets a reason held (or denied), the first {@value #TARGETS} by name, and how many more. */
    static String targets(List<DecisionEntry> decisions, Verdict verdict, ReasonCode code) {
        java.util.LinkedHashSet<String> all = new java.util.LinkedHashSet<>();
        for (DecisionEntry d : decisions) if (d.verdict() == verdict && d.reasons().contains(code)) all.add(d.target());
        List<String> first = all.stream().limit(TARGETS).toList();
        return String.join(", ", first) + (all.size() > first.size() ? " and " + (all.size() - first.size()) + " more" : "")
                + (all.size() == 1 ? " (1 target)" : " (" + all.size() + " targets)");
    }

    /**
     * Why a decision naming approval-required did not ask anyone: the engine asks a person only
     * when approval is the last reason left (a verdict of await-approval), once per problem;
     * these decisions were held or denied by another guard at the same moment. No answer
     * arrives in a replay.
     */
    static String approvalNote(long requested) {
        return requested + (requested == 1 ? " approval" : " approvals") + " requested: these decisions were also held"
                + " by another guard, and a person is asked only once approval is the last reason left";
    }

    static <T> void list(StringBuilder sb, List<T> items, java.util.function.Function<T, String> line) {
        int n = Math.min(items.size(), LISTED);
        for (int i = 0; i < n; i++) sb.append("  ").append(line.apply(items.get(i))).append('\n');
        if (items.size() > n) sb.append("  ... and ").append(items.size() - n).append(" more (see --format json)\n");
    }

    static String time(Instant t) {
        return t == null ? "-" : Rfc3339.format(t);
    }

    /** How many bad lines the text names; the JSON report lists every one. */
    static final int BAD_LINES_SHOWN = 20;

    private static void badLines(StringBuilder sb, RecordingInfo rec) {
        int shown = 0;
        for (dev.tend.shared.Problem p : rec.problems()) {
            if (shown++ == BAD_LINES_SHOWN) break;
            sb.append("  skipped ").append(p).append('\n');
        }
        if (rec.problems().size() > BAD_LINES_SHOWN) {
            sb.append("  ... and ").append(rec.problems().size() - BAD_LINES_SHOWN)
                    .append(" more bad lines; --format json lists every one\n");
        }
    }
}
