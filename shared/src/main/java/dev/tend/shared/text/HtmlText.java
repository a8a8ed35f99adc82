package dev.tend.shared.text;

/** Text made safe for HTML and XML: the one escape every page and report of tend uses. Stateless. */
public final class HtmlText {
    private HtmlText() {
    }

    /**
     * {@code text} escaped for an element's content or a quoted attribute value, in HTML and
     * in XML 1.0 alike: {@code & < > " '} become entities, and control characters other than
     * tab and line breaks (which XML 1.0 does not allow) become {@code ?}. "" for null.
     */
    public static String escape(String text) {
        if (text == null) return "";
        StringBuilder sb = new StringBuilder(text.length() + 16);
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            switch (c) {
                case '&' -> sb.append("&amp;");
                case '<' -> sb.append("&lt;");
                case '>' -> sb.append("&gt;");
                case '"' -> sb.append("&quot;");
                case '\'' -> sb.append("&#39;");
                default -> sb.append(c < 0x20 && c != '\t' && c != '\n' && c != '\r' ? '?' : c);
            }
        }
        return sb.toString();
    }
}
