package dev.tend.simulator.report;

import dev.tend.shared.ReasonCode;

import java.util.List;
import java.util.Locale;
import java.util.stream.Collectors;

import static dev.tend.simulator.report.ReportText.time;

/** The text form of a {@link ReportComparison}: summary side by side, then every run and reason that differs. */
public final class ComparisonText {
    private ComparisonText() {
    }

    public static String render(ReportComparison c) {
        StringBuilder sb = new StringBuilder();
        sb.append("replay of ").append(c.a().recording().name()).append(", seed ").append(c.a().replay().seed())
                .append(": A = ").append(c.labelA()).append(", B = ").append(c.labelB()).append('\n');
        sb.append(c.isSame() ? "no differences\n" : "").append('\n');
        sb.append(String.format(Locale.ROOT, "  %-22s %10s %10s %8s\n", "summary", "A", "B", "B-A"));
        for (SummaryDelta d : c.summary()) {
            if (d.flag()) {
                sb.append(String.format(Locale.ROOT, "  %-22s %10s %10s %8s", d.label(), d.a() == 1 ? "yes" : "no",
                        d.b() == 1 ? "yes" : "no", d.differs() ? "differs" : "").stripTrailing()).append('\n');
            } else {
                sb.append(String.format(Locale.ROOT, "  %-22s %10d %10d %8s", d.label(), d.a(), d.b(),
                        d.delta() == 0 ? "" : String.format(Locale.ROOT, "%+d", d.delta())).stripTrailing()).append('\n');
            }
        }
        if (!c.runs().isEmpty()) {
            sb.append("\nruns that differ: ").append(c.runs().size()).append('\n');
            ReportText.list(sb, c.runs(), ComparisonText::run);
        }
        if (!c.reasons().isEmpty()) {
            sb.append("\nhold and deny reasons that differ: ").append(c.reasons().size()).append('\n');
            ReportText.list(sb, c.reasons(), r -> r.playbook() + " on " + r.target() + ": A " + codes(r.a()) + ", B " + codes(r.b()));
        }
        return sb.toString();
    }

    static String run(RunDifference d) {
        String what = d.playbook() + " on " + d.target() + (d.occurrence() > 1 ? " (run " + d.occurrence() + " there)" : "");
        return switch (d.kind()) {
            case ONLY_IN_A -> "started only in A: " + what + ", " + d.a().run() + " at " + time(d.a().startedAt()) + ", " + d.a().outcome();
            case ONLY_IN_B -> "started only in B: " + what + ", " + d.b().run() + " at " + time(d.b().startedAt()) + ", " + d.b().outcome();
            case OUTCOME -> "different outcome: " + what + ": A " + d.a().outcome() + " (" + d.a().run() + "), B " + d.b().outcome()
                    + " (" + d.b().run() + ")";
        };
    }

    static String codes(List<ReasonCode> codes) {
        return codes.isEmpty() ? "none" : "[" + codes.stream().map(ReasonCode::code).collect(Collectors.joining(", ")) + "]";
    }
}
