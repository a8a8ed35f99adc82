package dev.tend.playbooks.lint;

import java.util.Locale;

/** How serious a lint finding is: an {@code error} is a problem to fix; a {@code warning} may be intended. */
public enum Severity {
    ERROR, WARNING;

    /** {@code error} or {@code warning}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT);
    }
}
