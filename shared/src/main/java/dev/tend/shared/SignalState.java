package dev.tend.shared;

import java.util.Locale;

/** The state a signal went to: {@code breach}, {@code silent} (no data arrived) or {@code clear}. */
public enum SignalState {
    BREACH, SILENT, CLEAR;

    private final String wireName;

    SignalState() {
        wireName = name().toLowerCase(Locale.ROOT);
    }

    /** The wire name: {@code breach}, {@code silent}, {@code clear}. */
    public String wireName() {
        return wireName;
    }

    /** True for breach and silent: the signal reports a problem. */
    public boolean isProblem() {
        return this != CLEAR;
    }

    /** Parses a wire name; throws {@link IllegalArgumentException} with a readable message. */
    public static SignalState parse(String wire) {
        if (wire != null) {
            for (SignalState s : values()) {
                if (s.wireName().equals(wire)) return s;
            }
        }
        throw new IllegalArgumentException("state must be breach, silent or clear, got '" + wire + "'");
    }
}
