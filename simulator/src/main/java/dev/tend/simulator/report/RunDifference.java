package dev.tend.simulator.report;

import dev.tend.shared.Id;

import java.util.Objects;

/**
 * A run that differs between two replays of one recording. Runs are paired by playbook and
 * target, the first run of a playbook on a target in one replay with the first in the
 * other, and so on ({@code occurrence}, from 1).
 *
 * @param a the run in replay A, or null when it started only in B
 * @param b the run in replay B, or null when it started only in A
 */
public record RunDifference(Kind kind, Id playbook, Id cluster, Id node, int occurrence, RunEntry a, RunEntry b) {
    public enum Kind {
        ONLY_IN_A("started only in A"), ONLY_IN_B("started only in B"), OUTCOME("different outcome");

        private final String words;

        Kind(String words) {
            this.words = words;
        }

        public String words() {
            return words;
        }

        public String code() {
            return name().toLowerCase(java.util.Locale.ROOT).replace('_', '-');
        }
    }

    public RunDifference {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(cluster, "cluster");
        if (occurrence < 1) throw new IllegalArgumentException("occurrence must be at least 1, got " + occurrence);
        if (a == null && b == null) throw new IllegalArgumentException("a run difference needs a run in A or in B");
        if (kind == Kind.ONLY_IN_A && (a == null || b != null)) throw new IllegalArgumentException("only-in-a needs a run in A and none in B");
        if (kind == Kind.ONLY_IN_B && (b == null || a != null)) throw new IllegalArgumentException("only-in-b needs a run in B and none in A");
        if (kind == Kind.OUTCOME && (a == null || b == null)) throw new IllegalArgumentException("outcome needs a run in A and in B");
    }

    public String target() {
        return node == null ? cluster.value() : cluster + "/" + node;
    }
}
