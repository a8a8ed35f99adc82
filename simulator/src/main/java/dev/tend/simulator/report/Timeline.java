package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.wire.Rfc3339;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * The inline SVG timeline of a replay: one row per cluster with runs (each run a bar from
 * its start to its end, coloured by outcome, its details in a tooltip), the fleet brake's
 * engaged periods shaded across the whole chart, and below them the unhealthy-cluster count
 * over time. Times are UTC. Rows are capped at {@value #MAX_ROWS}; the clusters with the most
 * runs are shown and the chart says how many were left out.
 */
final class Timeline {
    static final int MAX_ROWS = 40;
    private static final int WIDTH = 1040;
    private static final int LEFT = 150;
    private static final int RIGHT = 16;
    private static final int ROW = 18;
    private static final int TOP = 22;
    private static final int HEALTH = 110;
    private static final long[] TICKS_MINUTES = {5, 10, 15, 30, 60, 120, 180, 360, 720, 1440, 2880, 10080};

    private Timeline() {
    }

    static String svg(ReplayReport r) {
        Instant from = r.recording().from();
        Instant to = r.recording().horizon();
        if (from == null || to == null || !to.isAfter(from)) return "<p class=\"muted\">The recording holds no events: nothing to draw.</p>\n";
        double span = Duration.between(from, to).toMillis();
        double plot = WIDTH - LEFT - RIGHT;
        List<String> rows = rows(r.runs());
        int shownRows = Math.max(rows.size(), 1);
        int runsHeight = shownRows * ROW;
        int healthTop = TOP + runsHeight + 28;
        int height = healthTop + HEALTH + 30;
        StringBuilder sb = new StringBuilder(16 * 1024);
        sb.append("<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"").append(WIDTH).append("\" height=\"").append(height)
                .append("\" viewBox=\"0 0 ").append(WIDTH).append(' ').append(height).append("\" role=\"img\">\n");
        sb.append("<title>").append(Html.esc("timeline of " + r.recording().name())).append("</title>\n");
        for (BrakePeriod b : r.brakePeriods()) {
            double x1 = x(b.engagedAt(), from, span, plot);
            double x2 = x(b.releasedAt() == null ? to : b.releasedAt(), from, span, plot);
            sb.append(String.format(Locale.ROOT, "<rect x=\"%.1f\" y=\"%d\" width=\"%.1f\" height=\"%d\" fill=\"#f4c7c3\" opacity=\"0.6\">"
                    + "<title>%s</title></rect>\n", x1, TOP - 6, Math.max(x2 - x1, 1.5), height - TOP - 24,
                    Html.esc("fleet brake engaged " + Rfc3339.format(b.engagedAt()) + " to "
                            + (b.releasedAt() == null ? "the end" : Rfc3339.format(b.releasedAt())) + ": " + b.reason())));
        }
        ticks(sb, from, to, span, plot, height);
        if (rows.isEmpty()) {
            sb.append("<text x=\"").append(LEFT).append("\" y=\"").append(TOP + 12).append("\">no runs</text>\n");
        }
        Map<String, Integer> rowOf = new LinkedHashMap<>();
        for (int i = 0; i < rows.size(); i++) {
            rowOf.put(rows.get(i), i);
            int y = TOP + i * ROW;
            sb.append("<text x=\"").append(LEFT - 8).append("\" y=\"").append(y + 12).append("\" text-anchor=\"end\">")
                    .append(Html.esc(rows.get(i))).append("</text>\n");
            sb.append("<line x1=\"").append(LEFT).append("\" y1=\"").append(y + ROW).append("\" x2=\"").append(WIDTH - RIGHT)
                    .append("\" y2=\"").append(y + ROW).append("\" stroke=\"#eef1f4\"/>\n");
        }
        for (RunEntry run : r.runs()) {
            Integer row = rowOf.get(run.cluster().value());
            if (row == null) continue;
            double x1 = x(run.startedAt(), from, span, plot);
            double x2 = x(run.endedAt() == null ? to : run.endedAt(), from, span, plot);
            String fill = switch (run.outcome()) {
                case "succeeded" -> "#4f9a55";
                case "failed" -> "#c4473b";
                case "shadowed" -> "#9aa5b1";
                default -> "#d69a2d";
            };
            sb.append(String.format(Locale.ROOT, "<rect x=\"%.1f\" y=\"%d\" width=\"%.1f\" height=\"%d\" rx=\"2\" fill=\"%s\"><title>%s</title></rect>\n",
                    x1, TOP + row * ROW + 3, Math.max(x2 - x1, 2.5), ROW - 6, fill,
                    Html.esc(run.run() + " " + run.playbook() + " on " + run.target() + ": " + run.outcome() + ", "
                            + Rfc3339.format(run.startedAt()) + " to " + (run.endedAt() == null ? "not ended" : Rfc3339.format(run.endedAt())))));
        }
        int hidden = distinctClusters(r.runs()) - rows.size();
        if (hidden > 0) {
            sb.append("<text x=\"").append(LEFT).append("\" y=\"").append(TOP + runsHeight + 14).append("\" class=\"muted\">")
                    .append(hidden).append(" more clusters with runs are not drawn (the JSON report lists every run)</text>\n");
        }
        health(sb, r.unhealthy(), from, span, plot, healthTop, r.replay().healthInterval());
        sb.append("</svg>\n");
        return sb.toString();
    }

    private static void health(StringBuilder sb, List<HealthPoint> points, Instant from, double span, double plot, int top,
                               Duration interval) {
        int max = 1;
        for (HealthPoint p : points) max = Math.max(max, p.unhealthyClusters());
        sb.append("<text x=\"").append(LEFT - 8).append("\" y=\"").append(top + 10).append("\" text-anchor=\"end\">unhealthy</text>\n");
        sb.append("<text x=\"").append(LEFT - 8).append("\" y=\"").append(top + 24).append("\" text-anchor=\"end\">clusters</text>\n");
        sb.append("<text x=\"").append(LEFT - 8).append("\" y=\"").append(top + HEALTH).append("\" text-anchor=\"end\">0</text>\n");
        sb.append("<text x=\"").append(LEFT + 4).append("\" y=\"").append(top + 10).append("\">").append(max).append("</text>\n");
        sb.append("<line x1=\"").append(LEFT).append("\" y1=\"").append(top + HEALTH).append("\" x2=\"").append(WIDTH - RIGHT)
                .append("\" y2=\"").append(top + HEALTH).append("\" stroke=\"#b8c1ca\"/>\n");
        if (points.isEmpty()) return;
        StringBuilder path = new StringBuilder();
        double base = top + HEALTH;
        path.append(String.format(Locale.ROOT, "M%.1f %.1f", x(points.get(0).at(), from, span, plot), base));
        for (HealthPoint p : points) {
            double x1 = x(p.at(), from, span, plot);
            double x2 = x(p.at().plus(interval), from, span, plot);
            double y = base - (double) p.unhealthyClusters() / max * (HEALTH - 14);
            path.append(String.format(Locale.ROOT, " L%.1f %.1f L%.1f %.1f", x1, y, Math.min(x2, WIDTH - RIGHT), y));
        }
        path.append(String.format(Locale.ROOT, " L%.1f %.1f Z", Math.min(x(points.get(points.size() - 1).at().plus(interval), from, span, plot),
                WIDTH - RIGHT), base));
        sb.append("<path d=\"").append(path).append("\" fill=\"#c9d8ea\" stroke=\"#4a6f96\" stroke-width=\"1\"/>\n");
    }

    private static void ticks(StringBuilder sb, Instant from, Instant to, double span, double plot, int height) {
        long minutes = Duration.between(from, to).toMinutes();
        long step = TICKS_MINUTES[TICKS_MINUTES.length - 1];
        for (long t : TICKS_MINUTES) {
            if (minutes / t <= 10) {
                step = t;
                break;
            }
        }
        long stepSeconds = step * 60;
        long first = Math.floorDiv(from.getEpochSecond() + stepSeconds - 1, stepSeconds) * stepSeconds;
        for (long s = first; s <= to.getEpochSecond(); s += stepSeconds) {
            Instant t = Instant.ofEpochSecond(s);
            double x = x(t, from, span, plot);
            String label = Rfc3339.format(t).substring(5, step >= 1440 ? 10 : 16).replace('T', ' ');
            sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"%d\" x2=\"%.1f\" y2=\"%d\" stroke=\"#e3e7eb\"/>"
                    + "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">%s</text>\n", x, TOP - 6, x, height - 24, x, height - 10, label));
        }
        sb.append("<text x=\"").append(WIDTH - RIGHT).append("\" y=\"12\" text-anchor=\"end\" class=\"muted\">UTC</text>\n");
    }

    /** The clusters to draw: those with the most runs (ties by id), shown in id order. */
    private static List<String> rows(List<RunEntry> runs) {
        Map<String, Integer> count = new TreeMap<>();
        for (RunEntry r : runs) count.merge(r.cluster().value(), 1, Integer::sum);
        List<Map.Entry<String, Integer>> byCount = new ArrayList<>(count.entrySet());
        byCount.sort(Comparator.comparing((Map.Entry<String, Integer> e) -> -e.getValue()).thenComparing(Map.Entry::getKey));
        List<String> rows = new ArrayList<>();
        for (int i = 0; i < Math.min(MAX_ROWS, byCount.size()); i++) rows.add(byCount.get(i).getKey());
        rows.sort(Comparator.naturalOrder());
        return rows;
    }

    private static int distinctClusters(List<RunEntry> runs) {
        return (int) runs.stream().map(r -> r.cluster().value()).distinct().count();
    }

    private static double x(Instant t, Instant from, double span, double plot) {
        double f = Duration.between(from, t).toMillis() / span;
        return LEFT + Math.max(0, Math.min(1, f)) * plot;
    }
}
