package dev.tend.simulator.report;

import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;

import java.util.List;
import java.util.Objects;

/**
 * A playbook and target whose hold and deny reasons differ between two replays: every
 * reason code any hold or deny verdict for it named, in guard order, in A and in B.
 */
public record ReasonDifference(Id playbook, Id cluster, Id node, List<ReasonCode> a, List<ReasonCode> b) {
    public ReasonDifference {
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(cluster, "cluster");
        a = List.copyOf(a);
        b = List.copyOf(b);
        if (a.equals(b)) throw new IllegalArgumentException("a reason difference needs different reasons, got " + a + " in both");
    }

    public String target() {
        return node == null ? cluster.value() : cluster + "/" + node;
    }
}
