package dev.tend.store;

import dev.tend.shared.RunState;

import java.time.Instant;
import java.util.Objects;

/**
 * The projection of one run, as the CLI and API list it.
 *
 * @param runId           the run's id
 * @param playbook        the playbook that started it
 * @param playbookVersion that playbook's declared version, 0 or more
 * @param cluster         the cluster it acts on
 * @param node            the node it acts on; null for a cluster-scoped run
 * @param state           where the run stands
 * @param shadow          true for a run in shadow mode (decided and recorded, never executed)
 * @param createdAt       when the run was created
 * @param startedAt       when it started executing; null until then
 * @param endedAt         when it ended; null while it is active
 * @param outcome         how it ended; null while it is active
 * @param currentStep     the step it is at; null before the first and after the last
 * @param detail          more about the run as JSON text; null when there is nothing more
 */
public record RunRow(String runId, String playbook, int playbookVersion, String cluster, String node, RunState state,
                     boolean shadow, Instant createdAt, Instant startedAt, Instant endedAt, String outcome,
                     String currentStep, String detail) {
    public RunRow {
        Objects.requireNonNull(runId, "RunRow.runId must not be null");
        Objects.requireNonNull(playbook, "RunRow.playbook must not be null");
        if (playbookVersion < 0) throw new IllegalArgumentException("RunRow.playbookVersion must be 0 or more, got " + playbookVersion);
        Objects.requireNonNull(cluster, "RunRow.cluster must not be null");
        Objects.requireNonNull(state, "RunRow.state must not be null");
        Objects.requireNonNull(createdAt, "RunRow.createdAt must not be null");
    }

    /** True while the run has not ended ({@code endedAt} is null). */
    public boolean isActive() {
        return endedAt == null;
    }
}
