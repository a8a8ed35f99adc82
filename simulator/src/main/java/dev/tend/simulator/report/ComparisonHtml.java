package dev.tend.simulator.report;

import static dev.tend.simulator.report.Html.esc;

/**
 * The HTML form of a {@link ReportComparison}: one self-contained page with the summary
 * side by side, the runs and reasons that differ, and both timelines one above the other.
 */
public final class ComparisonHtml {
    private ComparisonHtml() {
    }

    public static String render(ReportComparison c) {
        StringBuilder sb = Html.page("replay comparison: " + c.a().recording().name(),
                "A = " + c.labelA() + ", B = " + c.labelB() + ", seed " + c.a().replay().seed()
                        + (c.isSame() ? "; no differences" : ""));
        sb.append("<h2>Summary</h2>\n<table><tr><th>summary</th><th>A</th><th>B</th><th>B-A</th></tr>\n");
        for (SummaryDelta d : c.summary()) {
            sb.append("<tr><td>").append(esc(d.label())).append("</td><td class=\"n\">")
                    .append(d.flag() ? (d.a() == 1 ? "yes" : "no") : String.valueOf(d.a())).append("</td><td class=\"n\">")
                    .append(d.flag() ? (d.b() == 1 ? "yes" : "no") : String.valueOf(d.b())).append("</td><td class=\"n")
                    .append(d.differs() ? " bad" : "").append("\">")
                    .append(d.flag() ? (d.differs() ? "differs" : "") : d.delta() == 0 ? "" : String.format(java.util.Locale.ROOT, "%+d", d.delta()))
                    .append("</td></tr>\n");
        }
        sb.append("</table>\n");
        ReportHtml.table(sb, "Runs that differ", c.runs(), "<th>difference</th>",
                d -> "<td>" + Html.text(ComparisonText.run(d)) + "</td>");
        ReportHtml.table(sb, "Hold and deny reasons that differ", c.reasons(), "<th>playbook</th><th>target</th><th>A</th><th>B</th>",
                r -> "<td>" + esc(r.playbook().value()) + "</td><td>" + esc(r.target()) + "</td><td><code>"
                        + esc(ComparisonText.codes(r.a())) + "</code></td><td><code>" + esc(ComparisonText.codes(r.b())) + "</code></td>");
        sb.append("<h2>Timeline A: ").append(esc(c.labelA())).append("</h2>\n");
        ReportHtml.tiles(sb, c.a().summary());
        sb.append(Timeline.svg(c.a()));
        sb.append("<h2>Timeline B: ").append(esc(c.labelB())).append("</h2>\n");
        ReportHtml.tiles(sb, c.b().summary());
        sb.append(Timeline.svg(c.b()));
        return Html.end(sb);
    }
}
