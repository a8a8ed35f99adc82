package dev.tend.shared;

import java.util.Objects;
import java.util.regex.Pattern;

/**
 * An identifier of a cluster, node, signal, playbook, step, action or run. Matches
 * {@code [A-Za-z0-9][A-Za-z0-9._:-]{0,127}} (wire format v1), so an id is always safe to
 * pass as a program argument or to put in a URL path.
 */
public record Id(String value) implements Comparable<Id> {
    public static final Pattern PATTERN = Pattern.compile("[A-Za-z0-9][A-Za-z0-9._:-]{0,127}");
    /** The longest id, in characters. */
    public static final int MAX_LENGTH = 128;

    public Id {
        Objects.requireNonNull(value, "id");
        if (!isValid(value)) {
            throw new IllegalArgumentException(describeInvalid(value));
        }
    }

    public static Id of(String value) {
        return new Id(value);
    }

    /** True when {@code value} matches {@link #PATTERN}; checked without a regex, as ids are checked on every wire line. */
    public static boolean isValid(String value) {
        if (value == null) return false;
        int n = value.length();
        if (n == 0 || n > MAX_LENGTH || !isAlphanumeric(value.charAt(0))) return false;
        for (int i = 1; i < n; i++) {
            char c = value.charAt(i);
            if (!isAlphanumeric(c) && c != '.' && c != '_' && c != ':' && c != '-') return false;
        }
        return true;
    }

    private static boolean isAlphanumeric(char c) {
        return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9');
    }

    /** Explains in a sentence why {@code value} is not an id. */
    public static String describeInvalid(String value) {
        if (value == null || value.isEmpty()) return "an id must not be empty";
        if (value.length() > MAX_LENGTH) return "an id is at most " + MAX_LENGTH + " characters, got " + value.length();
        return "'" + abbreviate(value) + "' is not an id: use letters, digits and . _ : - only, starting with a letter or digit";
    }

    private static String abbreviate(String v) {
        String shown = v.length() > 40 ? v.substring(0, 40) + "..." : v;
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < shown.length(); i++) {
            char c = shown.charAt(i);
            boolean pair = Character.isHighSurrogate(c) && i + 1 < shown.length() && Character.isLowSurrogate(shown.charAt(i + 1));
            if (c < 0x20 || c == 0x7f || Character.isSurrogate(c) && !pair) {
                sb.append(String.format("\\u%04x", (int) c)); // a lone surrogate cannot be written as UTF-8
            } else {
                sb.append(c);
                if (pair) sb.append(shown.charAt(++i));
            }
        }
        return sb.toString();
    }

    // written out rather than generated: ids are map keys on every event
    @Override
    public boolean equals(Object o) {
        return this == o || o instanceof Id other && value.equals(other.value);
    }

    @Override
    public int hashCode() {
        return value.hashCode();
    }

    @Override
    public int compareTo(Id o) {
        return value.compareTo(o.value);
    }

    @Override
    public String toString() {
        return value;
    }
}
