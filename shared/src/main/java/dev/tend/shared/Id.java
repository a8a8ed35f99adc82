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

    public Id {
        Objects.requireNonNull(value, "id");
        if (!PATTERN.matcher(value).matches()) {
            throw new IllegalArgumentException(describeInvalid(value));
        }
    }

    public static Id of(String value) {
        return new Id(value);
    }

    public static boolean isValid(String value) {
        return value != null && PATTERN.matcher(value).matches();
    }

    /** Explains in a sentence why {@code value} is not an id. */
    public static String describeInvalid(String value) {
        if (value == null || value.isEmpty()) return "an id must not be empty";
        if (value.length() > 128) return "an id is at most 128 characters, got " + value.length();
        return "'" + abbreviate(value) + "' is not an id: use letters, digits and . _ : - only, starting with a letter or digit";
    }

    private static String abbreviate(String v) {
        String shown = v.length() > 40 ? v.substring(0, 40) + "..." : v;
        StringBuilder sb = new StringBuilder();
        for (char c : shown.toCharArray()) {
            if (c < 0x20 || c == 0x7f) sb.append(String.format("\\u%04x", (int) c));
            else sb.append(c);
        }
        return sb.toString();
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
