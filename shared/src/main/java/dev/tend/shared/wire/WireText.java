package dev.tend.shared.wire;

import java.util.List;
import java.util.Map;

/** How input values are shown inside problem messages. */
final class WireText {
    private static final int MAX_SHOWN = 60;

    private WireText() {
    }

    /** {@code s} cut to a readable length, control characters escaped. */
    static String shown(String s) {
        boolean cut = s.length() > MAX_SHOWN;
        String part = cut ? s.substring(0, MAX_SHOWN) : s;
        StringBuilder sb = null;
        for (int i = 0; i < part.length(); i++) {
            char c = part.charAt(i);
            boolean lone = Character.isHighSurrogate(c) ? i + 1 >= part.length() || !Character.isLowSurrogate(part.charAt(i + 1))
                    : Character.isLowSurrogate(c) && (i == 0 || !Character.isHighSurrogate(part.charAt(i - 1)));
            if (c < 0x20 || c == 0x7f || lone) { // a lone surrogate cannot be written as UTF-8
                if (sb == null) sb = new StringBuilder(part.length() + 8).append(part, 0, i);
                sb.append(String.format("\\u%04x", (int) c));
            } else if (sb != null) {
                sb.append(c);
            }
        }
        String out = sb == null ? part : sb.toString();
        return cut ? out + "..." : out;
    }

    /** What a JSON value is, for "got ..." in messages: {@code 'down'}, {@code a number}, {@code null}. */
    static String got(Object v) {
        if (v == null) return "null";
        if (v instanceof String s) return "'" + shown(s) + "'";
        if (v instanceof Number) return "a number";
        if (v instanceof Boolean b) return b.toString();
        if (v instanceof Map<?, ?>) return "an object";
        if (v instanceof List<?>) return "a list";
        return v.getClass().getSimpleName();
    }
}
