package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * The handover timeline as inline SVG (no external reference of any kind): one row per
 * cluster, runs as bars from their start (or request) to their end (or the period's end),
 * coloured by state and stacked in lanes where they overlap, fleet brake periods shaded
 * across all rows, approvals as markers (a diamond where a person was asked, a dot where it
 * was settled). Every shape has a {@code <title>} with its details (the label on hover). The
 * axis spans where activity is ({@link #window}), not the whole period, and every run is at
 * least {@value #MIN_RUN} px wide. The legend is HTML beside the chart ({@link #legend}), where
 * the browser lays its words out, so they never overlap. The output is also well-formed XML.
 */
final class TimelineSvg {
    static final int WIDTH = 960;
    static final int LABEL = 130;
    static final int RIGHT = 16;
    static final int AXIS = 26;
    static final int LANE = 14;
    /** Clusters drawn at most; the rest are counted under the chart. */
    static final int MAX_ROWS = 150;
    /** The narrowest run drawn, in px: a one-second run is still a bar one can point at. */
    static final int MIN_RUN = 5;
    /** The shortest span the axis shows, so that a lone short run does not fill the width. */
    static final Duration MIN_WINDOW = Duration.ofMinutes(10);
    private static final long[] STEPS = {60, 300, 600, 900, 1800, 3600, 7200, 10_800, 21_600, 43_200, 86_400, 172_800, 604_800};

    private TimelineSvg() {
    }

    /**
     * The part of the period the axis spans: from a little before the first thing drawn (a run,
     * a brake period, an approval) to a little after the last, at least {@link #MIN_WINDOW}
     * (within the period), or the whole period when nothing happened in it.
     */
    static ReportPeriod window(HandoverReport r) {
        ReportPeriod p = r.period();
        Instant first = null, last = null;
        List<Instant[]> spans = new ArrayList<>();
        for (RunLine x : r.runs()) spans.add(new Instant[]{begin(x, p), end(x, p)});
        for (BrakePeriod b : r.brakePeriods()) {
            spans.add(new Instant[]{b.engagedAt().isBefore(p.since()) ? p.since() : b.engagedAt(),
                    b.isStillEngaged() || b.releasedAt().isAfter(p.until()) ? p.until() : b.releasedAt()});
        }
        for (ApprovalLine a : r.approvals()) {
            for (Instant t : new Instant[]{a.requestedAt(), a.decidedAt()}) if (t != null && p.contains(t)) spans.add(new Instant[]{t, t});
        }
        for (Instant[] sp : spans) {
            if (first == null || sp[0].isBefore(first)) first = sp[0];
            if (last == null || sp[1].isAfter(last)) last = sp[1];
        }
        if (first == null) return p;
        Duration pad = Duration.between(first, last).dividedBy(20);
        if (pad.compareTo(Duration.ofMinutes(1)) < 0) pad = Duration.ofMinutes(1);
        Instant from = first.minus(pad), to = last.plus(pad);
        Duration grow = MIN_WINDOW.minus(Duration.between(from, to));
        if (!grow.isNegative()) {
            from = from.minus(grow.dividedBy(2));
            to = to.plus(grow.dividedBy(2));
        }
        if (from.isBefore(p.since())) from = p.since();
        if (to.isAfter(p.until())) to = p.until();
        return ReportPeriod.of(from, to);
    }

    static String render(HandoverReport r) {
        ReportPeriod p = r.period();
        ReportPeriod w = window(r);
        Map<String, List<List<RunLine>>> lanes = lanes(r.runs(), p);
        Map<String, List<ApprovalLine>> marks = new TreeMap<>();
        for (ApprovalLine a : r.approvals()) {
            marks.computeIfAbsent(a.cluster(), k -> new ArrayList<>()).add(a);
            lanes.computeIfAbsent(a.cluster(), k -> new ArrayList<>());
        }
        List<String> clusters = new ArrayList<>(lanes.keySet());
        int hidden = Math.max(0, clusters.size() - MAX_ROWS);
        if (hidden > 0) clusters = clusters.subList(0, MAX_ROWS);
        int[] top = new int[clusters.size() + 1];
        top[0] = AXIS;
        for (int i = 0; i < clusters.size(); i++) top[i + 1] = top[i] + rowHeight(lanes.get(clusters.get(i)).size());
        int plotBottom = clusters.isEmpty() ? AXIS + 24 : top[clusters.size()];
        int height = plotBottom + 8;
        StringBuilder s = new StringBuilder();
        s.append("<svg class=\"timeline\" role=\"img\" viewBox=\"0 0 ").append(WIDTH).append(' ').append(height)
                .append("\" width=\"").append(WIDTH).append("\" height=\"").append(height)
                .append("\" aria-label=\"timeline of runs per cluster, fleet brake periods and approvals\">\n");
        for (int i = 0; i < clusters.size(); i++) {
            if (i % 2 == 1) rect(s, "row", 0, top[i], WIDTH, top[i + 1] - top[i], null);
            s.append("<text class=\"label\" x=\"6\" y=\"").append(top[i] + 14).append("\">")
                    .append(HandoverHtml.esc(clusters.get(i))).append("</text>\n");
        }
        axis(s, w, plotBottom);
        for (BrakePeriod b : r.brakePeriods()) {
            Instant from = b.engagedAt().isBefore(p.since()) ? p.since() : b.engagedAt();
            Instant to = b.isStillEngaged() ? p.until() : b.releasedAt();
            double x0 = x(from, w), x1 = Math.max(x(to, w), x0 + 2);
            rect(s, "brake", x0, AXIS, x1 - x0, plotBottom - AXIS, "fleet brake engaged " + TimeText.at(b.engagedAt())
                    + " by " + b.engagedBy() + (b.reason() == null ? "" : ": " + b.reason())
                    + (b.isStillEngaged() ? "; still engaged" : "; released " + TimeText.at(b.releasedAt()) + " by " + b.releasedBy()));
        }
        for (int i = 0; i < clusters.size(); i++) {
            List<List<RunLine>> rows = lanes.get(clusters.get(i));
            for (int lane = 0; lane < rows.size(); lane++) {
                for (RunLine x : rows.get(lane)) {
                    double x0 = Math.min(x(begin(x, p), w), WIDTH - RIGHT - MIN_RUN), x1 = Math.max(x(end(x, p), w), x0 + MIN_RUN);
                    rect(s, "run " + x.state(), x0, top[i] + 4 + lane * LANE, x1 - x0, LANE - 3, x.run() + " " + x.playbook()
                            + " " + x.target() + ": " + x.state() + (x.note() == null ? "" : " (" + x.note() + ")"));
                }
            }
            for (ApprovalLine a : marks.getOrDefault(clusters.get(i), List.of())) approval(s, a, p, w, top[i] + 10);
        }
        if (clusters.isEmpty()) {
            s.append("<text class=\"label\" x=\"").append(LABEL).append("\" y=\"").append(AXIS + 16)
                    .append("\">no runs or approvals in this period</text>\n");
        }
        s.append("</svg>\n");
        legend(s, hidden);
        return s.toString();
    }

    /** Runs per cluster, each in the first lane where it overlaps no other run. */
    private static Map<String, List<List<RunLine>>> lanes(List<RunLine> runs, ReportPeriod p) {
        Map<String, List<List<RunLine>>> out = new TreeMap<>(TimelineSvg::naturalOrder);
        for (RunLine x : runs) {
            List<List<RunLine>> rows = out.computeIfAbsent(x.cluster(), k -> new ArrayList<>());
            List<RunLine> free = null;
            for (List<RunLine> lane : rows) {
                RunLine last = lane.get(lane.size() - 1);
                if (!end(last, p).isAfter(begin(x, p))) {
                    free = lane;
                    break;
                }
            }
            if (free == null) rows.add(free = new ArrayList<>());
            free.add(x);
        }
        return out;
    }

    /** fares-2 before fares-10: runs of digits compare as numbers. */
    static int naturalOrder(String a, String b) {
        int i = 0, j = 0;
        while (i < a.length() && j < b.length()) {
            char ca = a.charAt(i), cb = b.charAt(j);
            if (Character.isDigit(ca) && Character.isDigit(cb)) {
                int ei = i, ej = j;
                while (ei < a.length() && Character.isDigit(a.charAt(ei))) ei++;
                while (ej < b.length() && Character.isDigit(b.charAt(ej))) ej++;
                String na = a.substring(i, ei).replaceFirst("^0+(?=.)", ""), nb = b.substring(j, ej).replaceFirst("^0+(?=.)", "");
                int c = na.length() != nb.length() ? Integer.compare(na.length(), nb.length()) : na.compareTo(nb);
                if (c != 0) return c;
                i = ei;
                j = ej;
            } else {
                if (ca != cb) return Character.compare(ca, cb);
                i++;
                j++;
            }
        }
        int c = Integer.compare(a.length() - i, b.length() - j);
        return c != 0 ? c : a.compareTo(b);
    }

    private static int rowHeight(int lanes) {
        return Math.max(1, lanes) * LANE + 8;
    }

    private static Instant begin(RunLine x, ReportPeriod p) {
        Instant b = x.startedAt() != null ? x.startedAt() : x.createdAt();
        return b.isBefore(p.since()) ? p.since() : b;
    }

    private static Instant end(RunLine x, ReportPeriod p) {
        return x.endedAt() == null || x.endedAt().isAfter(p.until()) ? p.until() : x.endedAt();
    }

    private static double x(Instant t, ReportPeriod p) {
        double f = (double) Duration.between(p.since(), t).toMillis() / p.length().toMillis();
        return LABEL + Math.max(0, Math.min(1, f)) * (WIDTH - LABEL - RIGHT);
    }

    private static void axis(StringBuilder s, ReportPeriod p, int bottom) {
        long span = p.length().getSeconds();
        long step = STEPS[STEPS.length - 1];
        for (long c : STEPS) {
            if (span / c <= 10) {
                step = c;
                break;
            }
        }
        long first = Math.floorDiv(p.since().getEpochSecond() + step - 1, step) * step;
        for (long t = first; t <= p.until().getEpochSecond(); t += step) {
            Instant at = Instant.ofEpochSecond(t);
            double x = x(at, p);
            s.append("<line class=\"grid\" x1=\"").append(num(x)).append("\" y1=\"").append(AXIS - 4).append("\" x2=\"")
                    .append(num(x)).append("\" y2=\"").append(bottom).append("\"/>\n");
            String label = step < 86_400 ? TimeText.at(at).substring(11, 16) : TimeText.at(at).substring(5, 10);
            s.append("<text class=\"tick\" x=\"").append(num(x)).append("\" y=\"").append(AXIS - 8).append("\">")
                    .append(label).append("</text>\n");
        }
        s.append("<text class=\"tick utc\" x=\"6\" y=\"").append(AXIS - 8).append("\">UTC</text>\n");
    }

    private static void approval(StringBuilder s, ApprovalLine a, ReportPeriod p, ReportPeriod w, int cy) {
        String what = "approval for " + a.run() + " " + a.playbook() + " " + a.target() + " asked " + TimeText.at(a.requestedAt())
                + ", " + a.state() + (a.decidedAt() == null ? ", expires " + TimeText.at(a.expiresAt())
                : " " + TimeText.at(a.decidedAt()) + (a.decidedBy() == null ? "" : " by " + a.decidedBy()));
        if (p.contains(a.requestedAt())) diamond(s, "ask " + a.state(), x(a.requestedAt(), w), cy, what);
        if (a.decidedAt() != null && p.contains(a.decidedAt())) {
            s.append("<circle class=\"settled ").append(a.state()).append("\" cx=\"").append(num(x(a.decidedAt(), w)))
                    .append("\" cy=\"").append(cy).append("\" r=\"4\"><title>").append(HandoverHtml.esc(what))
                    .append("</title></circle>\n");
        }
    }

    /** The key to the chart's colours and marks, as an HTML list that wraps like text. */
    private static void legend(StringBuilder s, int hidden) {
        String[][] items = {{"run succeeded", "succeeded"}, {"run failed", "failed"}, {"run cancelled", "cancelled"},
                {"run shadowed", "shadowed"}, {"run stood-down", "stood down"}, {"run running", "running"},
                {"run paused", "paused by the fleet brake"}, {"run needs-human", "needs a person"},
                {"run awaiting-approval", "awaiting approval"}, {"brake", "fleet brake engaged"}};
        s.append("<ul class=\"legend\">\n");
        for (String[] item : items) {
            s.append("<li><svg class=\"swatch\" width=\"14\" height=\"12\" viewBox=\"0 0 14 12\" aria-hidden=\"true\">");
            rect(s, item[0], 1, 1, 12, 10, null);
            s.append("</svg>").append(item[1]).append("</li>\n");
        }
        String[][] markers = {{"ask pending", "approval pending"}, {"ask", "approval asked, since settled"}};
        for (String[] m : markers) {
            s.append("<li><svg class=\"swatch\" width=\"14\" height=\"14\" viewBox=\"0 0 14 14\" aria-hidden=\"true\">");
            diamond(s, m[0], 7, 7, null);
            s.append("</svg>").append(m[1]).append("</li>\n");
        }
        String[][] dots = {{"settled approved", "approved"}, {"settled lapsed", "rejected, lapsed or withdrawn"}};
        for (String[] d : dots) {
            s.append("<li><svg class=\"swatch\" width=\"14\" height=\"14\" viewBox=\"0 0 14 14\" aria-hidden=\"true\">")
                    .append("<circle class=\"").append(d[0]).append("\" cx=\"7\" cy=\"7\" r=\"4\"/></svg>").append(d[1]).append("</li>\n");
        }
        s.append("</ul>\n");
        if (hidden > 0) {
            s.append("<p class=\"note\">").append(hidden).append(" more clusters not drawn; the run table lists them.</p>\n");
        }
    }

    private static void diamond(StringBuilder s, String cls, double x, double cy, String title) {
        s.append("<polygon class=\"").append(cls).append("\" points=\"").append(num(x)).append(',').append(num(cy - 6))
                .append(' ').append(num(x + 5)).append(',').append(num(cy)).append(' ').append(num(x)).append(',')
                .append(num(cy + 6)).append(' ').append(num(x - 5)).append(',').append(num(cy)).append('"');
        if (title == null) {
            s.append("/>\n");
        } else {
            s.append("><title>").append(HandoverHtml.esc(title)).append("</title></polygon>\n");
        }
    }

    private static void rect(StringBuilder s, String cls, double x, double y, double w, double h, String title) {
        s.append("<rect class=\"").append(cls).append("\" x=\"").append(num(x)).append("\" y=\"").append(num(y))
                .append("\" width=\"").append(num(w)).append("\" height=\"").append(num(h)).append('"');
        if (title == null) {
            s.append("/>\n");
        } else {
            s.append("><title>").append(HandoverHtml.esc(title)).append("</title></rect>\n");
        }
    }

    private static String num(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }
}
