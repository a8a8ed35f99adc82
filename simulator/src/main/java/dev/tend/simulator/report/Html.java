package dev.tend.simulator.report;

import dev.tend.shared.text.HtmlText;

/**
 * The page frame and escaping of the HTML reports: one self-contained file, its style
 * inline, no script, no font, no image or other asset fetched from anywhere.
 */
final class Html {
    private static final String STYLE = """
            body { font: 14px/1.45 system-ui, sans-serif; color: #1d2329; margin: 24px auto; max-width: 1080px; padding: 0 16px; }
            h1 { font-size: 20px; margin: 0 0 4px; }
            h2 { font-size: 15px; margin: 28px 0 8px; border-bottom: 1px solid #d5dbe1; padding-bottom: 4px; }
            p.sub { color: #5b6670; margin: 0 0 16px; }
            table { border-collapse: collapse; margin: 4px 0 8px; }
            th, td { text-align: left; padding: 3px 12px 3px 0; vertical-align: top; }
            th { font-weight: 600; color: #5b6670; border-bottom: 1px solid #d5dbe1; }
            td.n { text-align: right; font-variant-numeric: tabular-nums; }
            .tiles { display: flex; flex-wrap: wrap; gap: 10px; }
            .tile { border: 1px solid #d5dbe1; border-radius: 6px; padding: 8px 14px; min-width: 120px; }
            .tile b { display: block; font-size: 22px; }
            .tile span { color: #5b6670; font-size: 12px; }
            .t { white-space: nowrap; }
            .ok { color: #2f7d32; } .bad { color: #b3261e; } .muted { color: #5b6670; }
            svg text { font: 11px system-ui, sans-serif; fill: #39424a; }
            code { font-size: 13px; }
            """;

    private Html() {
    }

    static StringBuilder page(String title, String subtitle) {
        StringBuilder sb = new StringBuilder(32 * 1024);
        sb.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>").append(esc(title))
                .append("</title>\n<style>\n").append(STYLE).append("</style>\n</head>\n<body>\n<h1>").append(esc(title))
                .append("</h1>\n");
        if (subtitle != null) sb.append("<p class=\"sub\">").append(esc(subtitle)).append("</p>\n");
        return sb;
    }

    static String end(StringBuilder sb) {
        return sb.append("</body>\n</html>\n").toString();
    }

    static void tile(StringBuilder sb, String label, Object value, String cls) {
        sb.append("<div class=\"tile\"><b").append(cls == null ? "" : " class=\"" + cls + "\"").append('>')
                .append(esc(String.valueOf(value))).append("</b><span>").append(esc(label)).append("</span></div>");
    }

    private static final java.util.regex.Pattern TIME =
            java.util.regex.Pattern.compile("\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}(:\\d{2}(\\.\\d+)?)?(Z|[+-]\\d{2}:\\d{2})");

    /** Escaped text whose RFC 3339 times never break across lines (each in a {@code span.t}). */
    static String text(String text) {
        return TIME.matcher(esc(text)).replaceAll("<span class=\"t\">$0</span>");
    }

    /** {@link HtmlText#escape}: text safe for element content and quoted attributes; "" for null. */
    static String esc(String text) {
        return HtmlText.escape(text);
    }
}
