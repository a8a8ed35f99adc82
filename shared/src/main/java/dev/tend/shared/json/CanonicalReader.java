package dev.tend.shared.json;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.BooleanNode;
import com.fasterxml.jackson.databind.node.IntNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.LongNode;
import com.fasterxml.jackson.databind.node.NullNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.databind.node.TextNode;

import java.nio.charset.StandardCharsets;

/**
 * Reads a JSON object from its UTF-8 bytes and checks, in the same pass, that the bytes are
 * exactly what {@link CanonicalJson} writes for it: the work of parsing the text, writing the
 * tree again and comparing, without the second text. Reads only the ASCII texts whose
 * canonical form it can tell at sight: objects with members in ascending order of name,
 * arrays, strings with the minimal escapes, whole numbers below 2^53 written as their
 * digits, true, false, null; no whitespace. For anything else (a byte above 127, a fraction
 * or exponent, a larger number, a text that is not canonical or not JSON) it answers null
 * and the caller decides the slow way ({@link CanonicalJson#serialize} of the parsed tree);
 * so null says "not known to be canonical", never "not canonical".
 *
 * <p>The tree is the one Jackson's {@code readTree} gives for the text (int nodes where the
 * number fits an int, long nodes otherwise), its objects' members kept in a {@link MemberArray}.
 * Short texts met again and again (kinds, clusters, playbooks, nodes, reason codes; not times)
 * are one shared, immutable text node per thread instead of a new string each time.
 * Thread-safe.
 */
public final class CanonicalReader {
    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;
    /** Member names met on every entry, shared instead of copied from each text. */
    private static final String[] COMMON = {"action", "at", "attempt", "by", "cluster", "kind", "node", "playbook", "reason",
            "reasons", "run", "seq", "signal", "state", "step", "verdict"};
    /** {@link #COMMON} by the hash of their bytes (String's hash of an ASCII text), open addressing: a name is found in a probe or two. */
    private static final String[] COMMON_BY_HASH = new String[64];

    static {
        for (String n : COMMON) {
            int i = slot(n.hashCode(), COMMON_BY_HASH.length);
            while (COMMON_BY_HASH[i] != null) i = (i + 1) & (COMMON_BY_HASH.length - 1);
            COMMON_BY_HASH[i] = n;
        }
    }
    private static final long MAX_EXACT = 1L << 53;
    /** Deeper texts are left to the slow way (entries are two levels deep). */
    private static final int MAX_DEPTH = 64;
    /** Plain texts of at most this many bytes that do not start with a digit (a time does) are shared. */
    private static final int SHARED_MAX = 32;
    private static final int SHARED_SLOTS = 1024;
    /** Each thread's shared texts, by a hash of their bytes; a slot keeps the last text that hashed to it. */
    private static final ThreadLocal<TextNode[]> SHARED = ThreadLocal.withInitial(() -> new TextNode[SHARED_SLOTS]);

    private final byte[] text;
    private final TextNode[] shared;
    private int at;
    private int depth;

    private CanonicalReader(byte[] text) {
        this.text = text;
        this.shared = SHARED.get();
    }

    /** The object {@code text} holds when it is canonical JSON in the form described above; null otherwise or when unsure. */
    public static ObjectNode readObject(byte[] text) {
        if (text == null || text.length < 2 || text[0] != '{') return null;
        CanonicalReader r = new CanonicalReader(text);
        try {
            ObjectNode o = r.object();
            return o != null && r.at == text.length ? o : null;
        } catch (ArrayIndexOutOfBoundsException cut) {
            return null; // the text ends inside a value
        }
    }

    private ObjectNode object() {
        at++; // '{'
        if (++depth > MAX_DEPTH) return null;
        MemberArray members = new MemberArray();
        ObjectNode o = new ObjectNode(NODES, members);
        if (text[at] == '}') {
            at++;
            depth--;
            return o;
        }
        String previous = null;
        while (true) {
            if (text[at] != '"') return null;
            String name = name();
            if (name == null || (previous != null && previous.compareTo(name) >= 0) || text[at++] != ':') return null;
            JsonNode v = value();
            if (v == null) return null;
            members.append(name, v);
            previous = name;
            byte c = text[at++];
            if (c == '}') {
                depth--;
                return o;
            }
            if (c != ',') return null;
        }
    }

    private ArrayNode array() {
        at++; // '['
        if (++depth > MAX_DEPTH) return null;
        ArrayNode a = NODES.arrayNode();
        if (text[at] == ']') {
            at++;
            depth--;
            return a;
        }
        while (true) {
            JsonNode v = value();
            if (v == null) return null;
            a.add(v);
            byte c = text[at++];
            if (c == ']') {
                depth--;
                return a;
            }
            if (c != ',') return null;
        }
    }

    private JsonNode value() {
        byte c = text[at];
        switch (c) {
            case '"' -> {
                TextNode plain = shared();
                if (plain != null) return plain;
                String s = string();
                return s == null ? null : TextNode.valueOf(s);
            }
            case '{' -> {
                return object();
            }
            case '[' -> {
                return array();
            }
            case 't' -> {
                return literal("true") ? BooleanNode.TRUE : null;
            }
            case 'f' -> {
                return literal("false") ? BooleanNode.FALSE : null;
            }
            case 'n' -> {
                return literal("null") ? NullNode.instance : null;
            }
            default -> {
                return c == '-' || (c >= '0' && c <= '9') ? number() : null;
            }
        }
    }

    private boolean literal(String word) {
        for (int i = 0; i < word.length(); i++) if (text[at + i] != word.charAt(i)) return false;
        at += word.length();
        return true;
    }

    /** A whole number as {@link CanonicalJson#number} writes it: no leading zero, no "-0", below 2^53. */
    private JsonNode number() {
        boolean negative = text[at] == '-';
        if (negative) at++;
        int start = at;
        long v = 0;
        while (at < text.length && text[at] >= '0' && text[at] <= '9') {
            if (at - start >= 16) return null; // 17 digits or more: at least 10^16, past 2^53
            v = v * 10 + (text[at++] - '0');
        }
        int digits = at - start;
        if (digits == 0 || (digits > 1 && text[start] == '0') || (negative && v == 0) || v >= MAX_EXACT) return null;
        if (at < text.length && (text[at] == '.' || text[at] == 'e' || text[at] == 'E')) return null;
        if (negative) v = -v;
        return v == (int) v ? IntNode.valueOf((int) v) : LongNode.valueOf(v);
    }

    /** A member name: one of the common ones without a copy, else a shared one ({@link #shared}), else as {@link #string}. */
    private String name() {
        int start = at + 1;
        int end = start;
        int h = 0;
        while (end < text.length && text[end] != '"' && text[end] != '\\' && text[end] >= 0x20) h = 31 * h + text[end++];
        if (end < text.length && text[end] == '"') {
            int len = end - start;
            for (int i = slot(h, COMMON_BY_HASH.length); COMMON_BY_HASH[i] != null; i = (i + 1) & (COMMON_BY_HASH.length - 1)) {
                String n = COMMON_BY_HASH[i];
                if (n.length() == len && same(n, start)) {
                    at = end + 1;
                    return n;
                }
            }
        }
        TextNode plain = shared();
        return plain != null ? plain.textValue() : string();
    }

    private static int slot(int hash, int slots) {
        return (hash ^ (hash >>> 16)) & (slots - 1);
    }

    /**
     * The string at {@code at} as this thread's shared node when it is plain (printable ASCII, no
     * escape), at most {@link #SHARED_MAX} bytes and does not start with a digit; null, and
     * {@code at} unmoved, otherwise ({@link #string} reads it then).
     */
    private TextNode shared() {
        int start = at + 1;
        int end = start;
        int h = 0;
        int limit = Math.min(text.length, start + SHARED_MAX + 1);
        while (end < limit) {
            byte c = text[end];
            if (c == '"' || c == '\\' || c < 0x20) break; // a byte above 127 is negative: not plain either
            h = 31 * h + c;
            end++;
        }
        if (end >= limit || text[end] != '"') return null;
        int len = end - start;
        if (len > 0 && text[start] >= '0' && text[start] <= '9') return null;
        int slot = slot(h, SHARED_SLOTS);
        TextNode n = shared[slot];
        if (n == null || n.textValue().length() != len || !same(n.textValue(), start)) {
            n = TextNode.valueOf(new String(text, start, len, StandardCharsets.ISO_8859_1));
            shared[slot] = n;
        }
        at = end + 1;
        return n;
    }

    private boolean same(String s, int from) {
        for (int i = 0; i < s.length(); i++) if (text[from + i] != s.charAt(i)) return false;
        return true;
    }

    /** A string with the minimal escapes of RFC 8785 section 3.2.2.2 (as {@link CanonicalJson#writeString}); ASCII only. */
    private String string() {
        int start = ++at;
        while (true) {
            byte c = text[at];
            if (c == '"') {
                String s = new String(text, start, at - start, StandardCharsets.ISO_8859_1);
                at++;
                return s;
            }
            if (c == '\\') return escaped(start);
            if (c < 0x20) return null; // a control character written raw (or, as a negative byte, a non-ASCII one)
            at++;
        }
    }

    /** The rest of a string that holds an escape, from {@code start} (just after the quote); {@code at} is on the backslash. */
    private String escaped(int start) {
        StringBuilder sb = new StringBuilder(at - start + 16);
        sb.append(new String(text, start, at - start, StandardCharsets.ISO_8859_1));
        while (true) {
            byte c = text[at++];
            if (c == '"') return sb.toString();
            if (c < 0x20) return null;
            if (c != '\\') {
                sb.append((char) c);
                continue;
            }
            byte e = text[at++];
            switch (e) {
                case '"' -> sb.append('"');
                case '\\' -> sb.append('\\');
                case 'b' -> sb.append('\b');
                case 'f' -> sb.append('\f');
                case 'n' -> sb.append('\n');
                case 'r' -> sb.append('\r');
                case 't' -> sb.append('\t');
                case 'u' -> {
                    // only a control character without a short escape is written as \\u00xx, in lowercase hex
                    if (text[at] != '0' || text[at + 1] != '0') return null;
                    int hi = hex(text[at + 2]);
                    int lo = hex(text[at + 3]);
                    if (hi < 0 || hi > 1 || lo < 0) return null;
                    char u = (char) (hi * 16 + lo);
                    if (u == '\b' || u == '\f' || u == '\n' || u == '\r' || u == '\t') return null;
                    sb.append(u);
                    at += 4;
                }
                default -> {
                    return null; // "\/" and other escapes are valid JSON but not canonical
                }
            }
        }
    }

    private static int hex(byte b) {
        if (b >= '0' && b <= '9') return b - '0';
        if (b >= 'a' && b <= 'f') return b - 'a' + 10;
        return -1;
    }
}
