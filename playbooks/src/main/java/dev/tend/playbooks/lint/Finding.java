package dev.tend.playbooks.lint;

import java.util.Comparator;
import java.util.Objects;
import java.util.regex.Pattern;

/**
 * One lint finding about a playbook, located in its file.
 *
 * @param code     the check, e.g. {@code overlap}, {@code no-timeout}, {@code unsafe-limits}
 * @param line     1-based, 0 when not known
 * @param column   1-based, 0 when not known
 * @param playbook the id of the playbook the finding is about
 * @param message  a sentence a person understands
 */
public record Finding(Severity severity, String code, String file, int line, int column, String playbook, String message)
        implements Comparable<Finding> {
    private static final Pattern CODE = Pattern.compile("[a-z][a-z-]*");
    private static final Comparator<Finding> ORDER = Comparator.comparing(Finding::file)
            .thenComparingInt(Finding::line)
            .thenComparingInt(Finding::column)
            .thenComparing(Finding::code)
            .thenComparing(Finding::playbook)
            .thenComparing(Finding::message);

    public Finding {
        Objects.requireNonNull(severity, "severity");
        Objects.requireNonNull(code, "code");
        if (!CODE.matcher(code).matches()) throw new IllegalArgumentException("a finding code is lower-case words joined by '-', got '" + code + "'");
        Objects.requireNonNull(file, "file");
        if (line < 0 || column < 0) throw new IllegalArgumentException("line and column must be >= 0, got " + line + ":" + column);
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(message, "message");
        if (message.isBlank()) throw new IllegalArgumentException("a finding needs a message");
    }

    /** By file, line, column, code, playbook, then message. */
    @Override
    public int compareTo(Finding o) {
        return ORDER.compare(this, o);
    }

    /** {@code FILE:LINE:COL: severity: message [code]}. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder(file);
        if (line > 0) {
            sb.append(':').append(line);
            if (column > 0) sb.append(':').append(column);
        }
        return sb.append(": ").append(severity.wireName()).append(": ").append(message).append(" [").append(code).append(']').toString();
    }
}
