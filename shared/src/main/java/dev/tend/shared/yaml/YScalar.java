package dev.tend.shared.yaml;

import java.util.Objects;

/**
 * A scalar as written. {@code value} is the text (never null); {@code plainNull} is true
 * for an unquoted {@code null}, {@code ~} or empty value.
 */
public record YScalar(String value, boolean plainNull, boolean quoted, int line, int column) implements YNode {
    public YScalar {
        Objects.requireNonNull(value, "value");
    }

    @Override
    public String kind() {
        return "a value";
    }
}
