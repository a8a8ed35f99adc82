package dev.tend.shared;

import java.util.Objects;

/**
 * One located problem in an input: {@code FILE:LINE:COL: message}, the form editors and
 * CI annotate. Line and column are 1-based; 0 means "not known".
 *
 * @param source  the file name or another label of the input ("-" for standard input)
 * @param line    1-based line, 0 if unknown
 * @param column  1-based column, 0 if unknown
 * @param field   the field or key at fault, empty if none applies
 * @param message a sentence a person understands
 */
public record Problem(String source, int line, int column, String field, String message) {
    public Problem {
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(field, "field");
        Objects.requireNonNull(message, "message");
        if (line < 0 || column < 0) {
            throw new IllegalArgumentException("line and column must be >= 0, got " + line + ":" + column);
        }
    }

    public static Problem at(String source, int line, int column, String field, String message) {
        return new Problem(source, line, column, field, message);
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder(source);
        if (line > 0) {
            sb.append(':').append(line);
            if (column > 0) sb.append(':').append(column);
        }
        return sb.append(": ").append(message).toString();
    }
}
