package dev.tend.simulator.report;

import dev.tend.shared.Id;

import java.time.Instant;
import java.util.List;
import java.util.Objects;

/**
 * One run of a replay (DESIGN.md section 7, contract fields plus {@code detail}).
 *
 * @param run       the run id the engine gave it ({@code r000001})
 * @param node      null for a cluster-scope run
 * @param startedAt when it began executing (for a shadow-mode run: when it was decided)
 * @param endedAt   null when it had not ended when the replay stopped
 * @param outcome   succeeded, failed, cancelled, shadowed, or the state it was left in
 *                  (running, paused, needs-human)
 * @param detail    the engine's words about the outcome, or null
 */
public record RunEntry(String run, Id playbook, Id cluster, Id node, Instant startedAt, Instant endedAt,
                       String outcome, String detail, List<StepEntry> steps) {
    public RunEntry {
        Objects.requireNonNull(run, "run");
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(startedAt, "startedAt");
        Objects.requireNonNull(outcome, "outcome");
        if (endedAt != null && endedAt.isBefore(startedAt)) {
            throw new IllegalArgumentException("run " + run + ": endedAt (" + endedAt + ") must not be before startedAt (" + startedAt + ")");
        }
        steps = List.copyOf(steps);
    }

    /** The target as {@code cluster} or {@code cluster/node}. */
    public String target() {
        return node == null ? cluster.value() : cluster + "/" + node;
    }
}
