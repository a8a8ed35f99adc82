package dev.tend.shared.json;

import com.fasterxml.jackson.databind.JsonNode;

import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;

/**
 * The JSON Canonicalization Scheme of RFC 8785: object members sorted by the UTF-16 code
 * units of their names, no whitespace, strings with the minimal escapes, and numbers as
 * ECMAScript prints IEEE 754 doubles (shortest round-trip digits).
 *
 * <p>Accepts Java values (Map with String keys, List, String, Number, Boolean, null) or a
 * Jackson {@link JsonNode}. NaN and infinities are rejected, as RFC 8785 requires.
 * Stateless and thread-safe.
 */
public final class CanonicalJson {
    private CanonicalJson() {
    }

    public static String serialize(Object value) {
        StringBuilder sb = new StringBuilder(128);
        write(sb, value);
        return sb.toString();
    }

    /**
     * {@link #serialize} of {@code fields} with the members {@code extra} (name, value, name,
     * value ...) added, a member of {@code extra} replacing one of {@code fields} of the same
     * name: the same text as serializing the merged map, without building it (every ledger
     * entry is written so, with its seq, at and kind).
     */
    public static String serializeObject(Map<String, ?> fields, Object... extra) {
        return object(fields, null, null, extra).toString();
    }

    /**
     * {@link #serializeObject} with the value of the member {@code hole} (named in
     * {@code extra}, its value there ignored) left out: the text before that value and the
     * text after it. {@code parts[0] + number(v) + parts[1]} is what serializeObject gives
     * with the number {@code v} for {@code hole}, so a caller can render an object ahead and
     * put a number in when it is known (the ledger's seq, at its append).
     */
    public static String[] serializeObjectAround(Map<String, ?> fields, String hole, Object... extra) {
        if (extraAt(extra, hole) < 0) throw new IllegalArgumentException("the hole '" + hole + "' must be named in extra");
        int[] at = new int[1];
        StringBuilder sb = object(fields, hole, at, extra);
        return new String[]{sb.substring(0, at[0]), sb.substring(at[0])};
    }

    /** The object's text; the value of {@code hole} (when not null) is left out and {@code holeAt[0]} says where. */
    private static StringBuilder object(Map<String, ?> fields, String hole, int[] holeAt, Object... extra) {
        if (extra.length % 2 != 0) throw new IllegalArgumentException("extra holds name, value pairs; got " + extra.length + " items");
        String[] keys = new String[fields.size() + extra.length / 2];
        int n = 0;
        for (int i = 0; i < extra.length; i += 2) {
            if (!(extra[i] instanceof String k)) throw new IllegalArgumentException("JSON object keys must be strings, got " + extra[i]);
            keys[n++] = k;
        }
        for (Object k : fields.keySet()) {
            if (!(k instanceof String ks)) throw new IllegalArgumentException("JSON object keys must be strings, got " + k);
            if (extraAt(extra, ks) < 0) keys[n++] = ks;
        }
        java.util.Arrays.sort(keys, 0, n); // String.compareTo orders by UTF-16 code units, as RFC 8785 section 3.2.3 asks
        StringBuilder sb = new StringBuilder(256);
        sb.append('{');
        for (int i = 0; i < n; i++) {
            if (i > 0) sb.append(',');
            writeString(sb, keys[i]);
            sb.append(':');
            int e = extraAt(extra, keys[i]);
            if (hole != null && keys[i].equals(hole)) holeAt[0] = sb.length();
            else write(sb, e >= 0 ? extra[e + 1] : fields.get(keys[i]));
        }
        sb.append('}');
        return sb;
    }

    /** Where the member {@code key} is named in {@code extra}; -1 when it is not. */
    private static int extraAt(Object[] extra, String key) {
        for (int i = 0; i < extra.length; i += 2) if (extra[i].equals(key)) return i;
        return -1;
    }

    private static void write(StringBuilder sb, Object v) {
        if (v == null) {
            sb.append("null");
        } else if (v instanceof JsonNode n) {
            writeNode(sb, n);
        } else if (v instanceof String s) {
            writeString(sb, s);
        } else if (v instanceof Boolean b) {
            sb.append(b.booleanValue());
        } else if (v instanceof Number num) {
            sb.append(number(num.doubleValue()));
        } else if (v instanceof Map<?, ?> m) {
            List<String> keys = new ArrayList<>();
            for (Object k : m.keySet()) {
                if (!(k instanceof String ks)) throw new IllegalArgumentException("JSON object keys must be strings, got " + k);
                keys.add(ks);
            }
            keys.sort(null); // String.compareTo orders by UTF-16 code units, as RFC 8785 section 3.2.3 asks
            sb.append('{');
            boolean first = true;
            for (String k : keys) {
                if (!first) sb.append(',');
                first = false;
                writeString(sb, k);
                sb.append(':');
                write(sb, m.get(k));
            }
            sb.append('}');
        } else if (v instanceof Iterable<?> it) {
            sb.append('[');
            boolean first = true;
            for (Object o : it) {
                if (!first) sb.append(',');
                first = false;
                write(sb, o);
            }
            sb.append(']');
        } else if (v instanceof Enum<?> e) {
            writeString(sb, e.toString());
        } else {
            throw new IllegalArgumentException("not a JSON value: " + v.getClass().getName());
        }
    }

    private static void writeNode(StringBuilder sb, JsonNode n) {
        switch (n.getNodeType()) {
            case NULL, MISSING -> sb.append("null");
            case BOOLEAN -> sb.append(n.booleanValue());
            case NUMBER -> sb.append(number(n.doubleValue()));
            case STRING -> writeString(sb, n.textValue());
            case ARRAY -> {
                sb.append('[');
                for (int i = 0; i < n.size(); i++) {
                    if (i > 0) sb.append(',');
                    writeNode(sb, n.get(i));
                }
                sb.append(']');
            }
            case OBJECT -> {
                List<String> keys = new ArrayList<>();
                for (Iterator<String> it = n.fieldNames(); it.hasNext(); ) keys.add(it.next());
                keys.sort(null);
                sb.append('{');
                for (int i = 0; i < keys.size(); i++) {
                    if (i > 0) sb.append(',');
                    writeString(sb, keys.get(i));
                    sb.append(':');
                    writeNode(sb, n.get(keys.get(i)));
                }
                sb.append('}');
            }
            default -> throw new IllegalArgumentException("cannot canonicalize a " + n.getNodeType() + " node");
        }
    }

    /** RFC 8785 section 3.2.2.2: the minimal escapes, everything else as is. */
    static void writeString(StringBuilder sb, String s) {
        sb.append('"');
        int plain = plainPrefix(s);
        if (plain == s.length()) {
            // nothing to escape (nearly every key and value of a ledger entry): one copy instead of a call per char
            sb.append(s).append('"');
            return;
        }
        sb.append(s, 0, plain);
        for (int i = plain; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '"' -> sb.append("\\\"");
                case '\\' -> sb.append("\\\\");
                case '\b' -> sb.append("\\b");
                case '\f' -> sb.append("\\f");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                default -> {
                    if (c < 0x20) sb.append(String.format("\\u%04x", (int) c));
                    else sb.append(c);
                }
            }
        }
        sb.append('"');
    }

    /** How many chars of {@code s} from the start need no escape. */
    private static int plainPrefix(String s) {
        int n = s.length();
        for (int i = 0; i < n; i++) {
            char c = s.charAt(i);
            if (c < 0x20 || c == '"' || c == '\\') return i;
        }
        return n;
    }

    /**
     * The fewest significant digits that read back as {@code d} (positive, finite), and of
     * those the value closest to {@code d}. At each precision only the two neighbours of the
     * exact value can qualify; the nearer one is tried first. Both must be tried: just
     * above a power of two the doubles below are twice as dense as those above, so the
     * nearer neighbour can miss while the farther one, on the wide side, still reads back.
     */
    private static BigDecimal shortest(double d) {
        BigDecimal exact = new BigDecimal(d);
        for (int p = 1; p < 17; p++) {
            BigDecimal nearest = exact.round(new MathContext(p, RoundingMode.HALF_EVEN));
            if (nearest.doubleValue() == d) return nearest;
            RoundingMode other = nearest.compareTo(exact) < 0 ? RoundingMode.UP : RoundingMode.DOWN;
            BigDecimal farther = exact.round(new MathContext(p, other));
            if (farther.doubleValue() == d) return farther;
        }
        return exact.round(new MathContext(17, RoundingMode.HALF_EVEN)); // 17 digits always read back
    }

    /**
     * Formats a double as ECMAScript's Number.prototype.toString does (RFC 8785 section
     * 3.2.2.3): the shortest digits that read back as the same double, closest to the exact
     * value, then plain notation for exponents from -6 to 20 and {@code d.ddde+N} otherwise.
     */
    public static String number(double d) {
        if (Double.isNaN(d) || Double.isInfinite(d)) {
            throw new IllegalArgumentException("RFC 8785 has no form for " + d + "; NaN and infinities are not JSON numbers");
        }
        if (d == 0) return "0"; // also -0
        if (d == Math.rint(d) && Math.abs(d) < 0x1p53) {
            // a whole number below 2^53 (every seq, count and attempt): its shortest digits are the integer's own,
            // and below 10^21 ECMAScript writes them plainly; the search below costs microseconds of BigDecimal
            return Long.toString((long) d);
        }
        StringBuilder sb = new StringBuilder(32);
        if (d < 0) {
            sb.append('-');
            d = -d;
        }
        BigDecimal shortest = shortest(d);
        BigInteger unscaled = shortest.unscaledValue();
        String digits = unscaled.toString();
        int trailing = 0;
        while (digits.length() - trailing > 1 && digits.charAt(digits.length() - 1 - trailing) == '0') trailing++;
        digits = digits.substring(0, digits.length() - trailing);
        int k = digits.length();
        // value = 0.digits * 10^n, i.e. n is the position of the decimal point
        int n = digits.length() + trailing - shortest.scale();
        if (k <= n && n <= 21) {
            sb.append(digits);
            for (int i = 0; i < n - k; i++) sb.append('0');
        } else if (0 < n && n <= 21) {
            sb.append(digits, 0, n).append('.').append(digits, n, k);
        } else if (-6 < n && n <= 0) {
            sb.append("0.");
            for (int i = 0; i < -n; i++) sb.append('0');
            sb.append(digits);
        } else {
            int e = n - 1;
            sb.append(digits.charAt(0));
            if (k > 1) sb.append('.').append(digits, 1, k);
            sb.append('e').append(e < 0 ? '-' : '+').append(Math.abs(e));
        }
        return sb.toString();
    }
}
