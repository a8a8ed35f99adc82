package dev.tend.shared.wire;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.io.JsonEOFException;
import com.fasterxml.jackson.core.json.ReaderBasedJsonParser;

import java.io.IOException;
import java.math.BigInteger;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * One line taken apart into its top-level fields, in line order, each with the column
 * where its value starts. Values are plain Java JSON values: Map (insertion-ordered),
 * List, String, Integer/Long/BigInteger, Double, Boolean, null. Duplicate keys, at any
 * depth, and numbers no 64-bit float can hold are rejected, so that every value read can
 * be written back and canonicalized (RFC 8785) unchanged.
 *
 * <p>Each line gets its own instance, confined to the thread parsing it; fields are kept in
 * small arrays rather than a map, as a line has only a handful.
 */
final class JsonLine {
    /** Past this many fields, duplicates are looked up in a set rather than by scanning. */
    private static final int SCAN_LIMIT = 32;

    private String[] names = new String[8];
    private Object[] values = new Object[8];
    private int[] columns = new int[8];
    private int size;
    private Set<String> seen;

    JsonLine() {
    }

    int size() {
        return size;
    }

    String name(int i) {
        return names[i];
    }

    Object value(int i) {
        return values[i];
    }

    /** 1-based column where field {@code i}'s value starts. */
    int column(int i) {
        return columns[i];
    }

    /** The index of field {@code name}, or -1 when the line does not have it. */
    int indexOf(String name) {
        for (int i = 0; i < size; i++) {
            if (names[i] == name) return i; // Jackson interns field names
        }
        for (int i = 0; i < size; i++) {
            if (names[i].equals(name)) return i;
        }
        return -1;
    }

    boolean has(String name) {
        return indexOf(name) >= 0;
    }

    /**
     * The fields of {@code line}, which must hold exactly one JSON object. A line of the usual
     * shape is taken apart by hand ({@link FlatLine}); any other, and every line with a fault,
     * goes through Jackson, whose reading (and wording of refusals) the fast path matches.
     */
    static JsonLine parse(String line) throws LineRejected {
        JsonLine fast = FlatLine.read(line);
        return fast != null ? fast : parseWithJackson(line);
    }

    /** The fields of {@code line} as Jackson reads them: the reference the fast path is held to. */
    static JsonLine parseWithJackson(String line) throws LineRejected {
        JsonLine fields = new JsonLine();
        fields.read(line);
        return fields;
    }

    private void read(String line) throws LineRejected {
        try (JsonParser p = WireJson.FACTORY.createParser(line)) {
            JsonToken t;
            try {
                t = p.nextToken();
                if (t != JsonToken.START_OBJECT) {
                    throw new LineRejected(column(p.currentTokenLocation()), "",
                            "this line is " + rootKind(t) + ", not an object: each line holds one JSON object");
                }
                while ((t = p.nextToken()) == JsonToken.FIELD_NAME) {
                    String name = p.currentName();
                    if (isDuplicate(name)) {
                        throw new LineRejected(column(p.currentTokenLocation()), name, "field '" + WireText.shown(name) + "' is given twice");
                    }
                    t = p.nextToken();
                    int valueColumn = valueColumn(p);
                    add(name, value(p, t, name), valueColumn);
                }
            } catch (JsonProcessingException e) {
                throw notJson(e);
            }
            int after = 0;
            try {
                t = p.nextToken();
                if (t != null) after = column(p.currentTokenLocation());
            } catch (JsonProcessingException e) {
                t = JsonToken.NOT_AVAILABLE;
                after = e.getLocation() == null ? 0 : column(e.getLocation());
            }
            if (t != null) {
                throw new LineRejected(after, "", "this line goes on after its JSON object ends: each line holds one JSON object");
            }
        } catch (IOException e) {
            // a String source cannot fail to read; Jackson declares it all the same
            throw new LineRejected(0, "", "this line is not JSON: " + e.getMessage());
        }
    }

    private boolean isDuplicate(String name) {
        if (seen != null) return seen.contains(name);
        if (indexOf(name) >= 0) return true;
        if (size == SCAN_LIMIT) seen = new HashSet<>(Arrays.asList(names).subList(0, size));
        return false;
    }

    void add(String name, Object value, int column) {
        if (size == names.length) {
            names = Arrays.copyOf(names, size * 2);
            values = Arrays.copyOf(values, size * 2);
            columns = Arrays.copyOf(columns, size * 2);
        }
        names[size] = name;
        values[size] = value;
        columns[size] = column;
        size++;
        if (seen != null) seen.add(name);
    }

    private static Object value(JsonParser p, JsonToken t, String field) throws IOException, LineRejected {
        switch (t) {
            case START_OBJECT: {
                Map<String, Object> map = new LinkedHashMap<>();
                while (p.nextToken() == JsonToken.FIELD_NAME) {
                    String key = p.currentName();
                    int keyColumn = column(p.currentTokenLocation());
                    Object v = value(p, p.nextToken(), field);
                    if (map.containsKey(key)) {
                        throw new LineRejected(keyColumn, field, "field '" + WireText.shown(field) + "': key '"
                                + WireText.shown(key) + "' is given twice");
                    }
                    map.put(key, v);
                }
                return map;
            }
            case START_ARRAY: {
                List<Object> list = new ArrayList<>();
                JsonToken item;
                while ((item = p.nextToken()) != JsonToken.END_ARRAY) list.add(value(p, item, field));
                return list;
            }
            case VALUE_STRING:
                return p.getText();
            case VALUE_NUMBER_INT:
                switch (p.getNumberType()) {
                    case INT:
                        return p.getIntValue();
                    case LONG:
                        return p.getLongValue();
                    default: {
                        BigInteger big = p.getBigIntegerValue();
                        if (Double.isInfinite(big.doubleValue())) throw tooLarge(p, field);
                        return big;
                    }
                }
            case VALUE_NUMBER_FLOAT: {
                double d = p.getDoubleValue();
                if (Double.isInfinite(d)) throw tooLarge(p, field);
                return d;
            }
            case VALUE_TRUE:
                return Boolean.TRUE;
            case VALUE_FALSE:
                return Boolean.FALSE;
            case VALUE_NULL:
                return null;
            default:
                throw new LineRejected(column(p.currentTokenLocation()), field, "field '" + WireText.shown(field)
                        + "' holds something that is not a JSON value");
        }
    }

    private static LineRejected tooLarge(JsonParser p, String field) throws IOException {
        return new LineRejected(column(p.currentTokenLocation()), field, "field '" + WireText.shown(field)
                + "': the number " + WireText.shown(p.getText()) + " is too large for a 64-bit float (RFC 7493, I-JSON)");
    }

    private static LineRejected notJson(JsonProcessingException e) {
        int col = e.getLocation() == null ? 0 : column(e.getLocation());
        String original = e.getOriginalMessage();
        if (e instanceof JsonEOFException || (original != null && original.startsWith("Unexpected end-of-input"))) {
            return new LineRejected(col, "", "this line is not JSON: it ends before the JSON object is closed");
        }
        return new LineRejected(col, "", "this line is not JSON: " + plain(original));
    }

    /** Jackson's message without its location notes and source excerpts. */
    private static String plain(String message) {
        if (message == null) return "it cannot be read";
        String m = message;
        int nl = m.indexOf('\n');
        if (nl >= 0) m = m.substring(0, nl);
        int at = m.indexOf(" at [Source");
        if (at >= 0) m = m.substring(0, at);
        m = m.replaceAll(", from `[^`]*`", "").replaceAll("`[^`]*`", "a limit of the reader");
        return m.strip();
    }

    private static String rootKind(JsonToken t) {
        if (t == null) return "empty";
        return switch (t) {
            case START_ARRAY -> "a JSON list";
            case VALUE_STRING -> "a JSON string";
            case VALUE_NUMBER_INT, VALUE_NUMBER_FLOAT -> "a JSON number";
            case VALUE_TRUE, VALUE_FALSE -> "a JSON boolean";
            case VALUE_NULL -> "JSON null";
            default -> "not a JSON object";
        };
    }

    /**
     * The column {@link #column(JsonLocation)} gives for the current token, a value (not a field
     * name), without the location object Jackson builds for each call of
     * {@code currentTokenLocation()}: every field of every line asks. A parser of a string
     * reports there its token's 0-based column ({@code getTokenColumnNr()} is that plus one);
     * {@code JsonLineTest} holds the two equal.
     */
    static int valueColumn(JsonParser p) {
        if (p instanceof ReaderBasedJsonParser r) {
            int c = r.getTokenColumnNr() - 1;
            return c <= 0 ? 0 : c;
        }
        return column(p.currentTokenLocation());
    }

    private static int column(JsonLocation loc) {
        long c = loc.getColumnNr();
        return c <= 0 || c > Integer.MAX_VALUE ? 0 : (int) c;
    }
}
