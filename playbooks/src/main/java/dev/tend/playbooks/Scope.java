package dev.tend.playbooks;

import java.util.Locale;

/** Whether a signal, trigger or mask concerns one node or the whole cluster. */
public enum Scope {
    NODE, CLUSTER;

    /** The playbook spelling: {@code node} or {@code cluster}. */
    public String wireName() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Parses {@code node} or {@code cluster}; throws {@link IllegalArgumentException} naming both. */
    public static Scope parse(String text) {
        for (Scope s : values()) {
            if (s.wireName().equals(text)) return s;
        }
        throw new IllegalArgumentException("must be node or cluster, got '" + text + "'");
    }
}
