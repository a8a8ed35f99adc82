package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.util.Objects;

/**
 * One {@code unless} entry: while {@code signal} is in breach or silent on the same node
 * ({@code on: node}) or anywhere on the same cluster as a cluster-level signal
 * ({@code on: cluster}), the playbook must not act; that signal explains the problem.
 */
public record MaskRule(Id signal, Scope on) {
    public MaskRule {
        Objects.requireNonNull(signal, "unless.signal");
        Objects.requireNonNull(on, "unless.on");
    }

    @Override
    public String toString() {
        return signal + " on " + on.wireName();
    }
}
