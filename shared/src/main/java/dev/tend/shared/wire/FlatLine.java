package dev.tend.shared.wire;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The fast path of {@link JsonLine}: takes apart by hand, from the line's characters, a line
 * of the usual shape (one JSON object of printable ASCII strings without escapes, plain
 * numbers, true, false, null, shallow objects and lists), with no Jackson parser per line.
 *
 * <p>It gives exactly what the Jackson path gives (the same names, values of the same
 * classes and columns) or declines: anything it does not fully handle (an escape, a
 * character outside printable ASCII, a number of more than 18 digits, nesting deeper than
 * {@value #MAX_DEPTH}, a duplicate key, any error at all) makes it return null, and the
 * line then goes through Jackson, which alone words every refusal. Jackson is the reference:
 * {@code FlatLineTest} compares the two on the bundled recordings, random and mutated lines.
 */
final class FlatLine {
    private static final int MAX_DEPTH = 4;
    private static final int MAX_LENGTH = 1 << 16;
    private static final int MAX_NUMBER = 32;
    /** Field names of the wire, returned as these constants (the Jackson path interns names). */
    private static final String[] KNOWN = {"at", "cluster", "node", "signal", "state", "detail", "topology",
        "attrs", "recording", "fleet", "from", "until", "description"};

    private final String s;
    private final int end;
    private int i;

    private FlatLine(String s) {
        this.s = s;
        this.end = s.length();
    }

    /** The fields of {@code line}, or null to leave it to Jackson. */
    static JsonLine read(String line) {
        if (line.length() > MAX_LENGTH) return null;
        JsonLine fields = new JsonLine();
        return new FlatLine(line).object(fields) ? fields : null;
    }

    private boolean object(JsonLine into) {
        skip();
        if (!at('{')) return false;
        i++;
        skip();
        if (at('}')) {
            i++;
            return rest();
        }
        while (true) {
            if (!at('"')) return false;
            String name = name();
            if (name == null || into.has(name)) return false;
            skip();
            if (!at(':')) return false;
            i++;
            skip();
            int column = i + 1;
            Object v = value(1);
            if (v == DECLINE) return false;
            into.add(name, v, column);
            int after = separator('}');
            if (after == CLOSED) return rest();
            if (after == BROKEN) return false;
        }
    }

    private static final int MORE = 0;
    private static final int CLOSED = 1;
    private static final int BROKEN = 2;

    /** After a member or an element: a comma (more follow), the closing {@code close}, or anything else. */
    private int separator(char close) {
        skip();
        if (at(',')) {
            i++;
            skip();
            return MORE;
        }
        if (at(close)) {
            i++;
            return CLOSED;
        }
        return BROKEN;
    }

    /** Only whitespace may follow the object. */
    private boolean rest() {
        skip();
        return i == end;
    }

    private static final Object DECLINE = new Object();

    private Object value(int depth) {
        if (i >= end) return DECLINE;
        char c = s.charAt(i);
        switch (c) {
            case '"':
                return string();
            case '{':
                return depth < MAX_DEPTH ? map(depth + 1) : DECLINE;
            case '[':
                return depth < MAX_DEPTH ? list(depth + 1) : DECLINE;
            case 't':
                return literal("true", Boolean.TRUE);
            case 'f':
                return literal("false", Boolean.FALSE);
            case 'n':
                return literal("null", null);
            default:
                return c == '-' || c >= '0' && c <= '9' ? number() : DECLINE;
        }
    }

    private Object map(int depth) {
        i++;
        Map<String, Object> map = new LinkedHashMap<>();
        skip();
        if (at('}')) {
            i++;
            return map;
        }
        while (true) {
            if (!at('"')) return DECLINE;
            Object key = string();
            if (key == DECLINE || map.containsKey(key)) return DECLINE;
            skip();
            if (!at(':')) return DECLINE;
            i++;
            skip();
            Object v = value(depth);
            if (v == DECLINE) return DECLINE;
            map.put((String) key, v);
            int after = separator('}');
            if (after == CLOSED) return map;
            if (after == BROKEN) return DECLINE;
        }
    }

    private Object list(int depth) {
        i++;
        List<Object> list = new ArrayList<>();
        skip();
        if (at(']')) {
            i++;
            return list;
        }
        while (true) {
            Object v = value(depth);
            if (v == DECLINE) return DECLINE;
            list.add(v);
            int after = separator(']');
            if (after == CLOSED) return list;
            if (after == BROKEN) return DECLINE;
        }
    }

    /** A string at {@code i} (its opening quote) of printable ASCII without escapes. */
    private Object string() {
        int start = i + 1;
        int j = start;
        while (j < end) {
            char c = s.charAt(j);
            if (c == '"') {
                i = j + 1;
                return s.substring(start, j);
            }
            if (c < 0x20 || c > 0x7e || c == '\\') return DECLINE;
            j++;
        }
        return DECLINE;
    }

    private String name() {
        int start = i + 1;
        Object text = string();
        if (text == DECLINE) return null;
        int length = i - 1 - start;
        for (String k : KNOWN) {
            if (k.length() == length && s.regionMatches(start, k, 0, length)) return k;
        }
        return (String) text;
    }

    private Object literal(String word, Object value) {
        if (!s.startsWith(word, i)) return DECLINE;
        i += word.length();
        return i < end && isWordChar(s.charAt(i)) ? DECLINE : value;
    }

    /**
     * A number in JSON's grammar: integers of up to 18 digits become Integer when they fit,
     * else Long, as Jackson's number type says; others become the double
     * {@link Double#parseDouble} gives, which is what Jackson's default reading gives.
     */
    private Object number() {
        int start = i;
        int j = i;
        if (s.charAt(j) == '-') j++;
        int digits = j;
        if (j < end && s.charAt(j) == '0') {
            j++;
        } else {
            while (j < end && isDigit(s.charAt(j))) j++;
        }
        int intDigits = j - digits;
        if (intDigits == 0) return DECLINE;
        boolean fraction = false;
        if (j < end && s.charAt(j) == '.') {
            fraction = true;
            int f = ++j;
            while (j < end && isDigit(s.charAt(j))) j++;
            if (j == f) return DECLINE;
        }
        if (j < end && (s.charAt(j) == 'e' || s.charAt(j) == 'E')) {
            fraction = true;
            j++;
            if (j < end && (s.charAt(j) == '+' || s.charAt(j) == '-')) j++;
            int e = j;
            while (j < end && isDigit(s.charAt(j))) j++;
            if (j == e) return DECLINE;
        }
        if (j < end && (isWordChar(s.charAt(j)) || s.charAt(j) == '.')) return DECLINE;
        if (j - start > MAX_NUMBER) return DECLINE;
        i = j;
        if (fraction) {
            double d = Double.parseDouble(s.substring(start, j));
            return Double.isInfinite(d) ? DECLINE : d;
        }
        if (intDigits > 18) return DECLINE;
        long v = 0;
        for (int k = digits; k < j; k++) v = v * 10 + (s.charAt(k) - '0');
        if (digits > start) v = -v;
        return v >= Integer.MIN_VALUE && v <= Integer.MAX_VALUE ? (Object) (int) v : (Object) v;
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    /** A character that would make a number or literal run on (Jackson then refuses or reads on). */
    private static boolean isWordChar(char c) {
        return c >= '0' && c <= '9' || c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c == '_' || c == '+' || c == '-'
                || c > 0x7e;
    }

    private boolean at(char c) {
        return i < end && s.charAt(i) == c;
    }

    /** JSON's whitespace: space, tab, line feed, carriage return. */
    private void skip() {
        while (i < end) {
            char c = s.charAt(i);
            if (c != ' ' && c != '\t' && c != '\n' && c != '\r') return;
            i++;
        }
    }
}
