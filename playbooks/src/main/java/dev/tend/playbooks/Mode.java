package dev.tend.playbooks;

import java.util.Locale;

/**
 * How a playbook acts: {@code live} executes its steps; {@code shadow} decides and records
 * every verdict exactly as live would, but never executes.
 */
public enum Mode {
    LIVE, SHADOW;

    /** The playbook spelling: {@code live} or {@code shadow}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Parses {@code live} or {@code shadow}; throws {@link IllegalArgumentException} naming both. */
    public static Mode parse(String text) {
        for (Mode m : values()) {
            if (m.wireName().equals(text)) return m;
        }
        throw new IllegalArgumentException("must be live or shadow, got '" + text + "'");
    }
}
