package dev.tend.shared;

import java.util.Locale;

/** What a topology event says happened to a node: {@code joined}, {@code left} or {@code changed}. */
public enum TopologyChange {
    JOINED, LEFT, CHANGED;

    private final String wireName;

    TopologyChange() {
        wireName = name().toLowerCase(Locale.ROOT);
    }

    public String wireName() {
        return wireName;
    }

    public static TopologyChange parse(String wire) {
        for (TopologyChange t : values()) {
            if (t.wireName().equals(wire)) return t;
        }
        throw new IllegalArgumentException("topology must be joined, left or changed, got '" + wire + "'");
    }
}
