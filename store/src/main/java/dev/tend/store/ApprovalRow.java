package dev.tend.store;

import dev.tend.shared.ApprovalState;

import java.time.Instant;
import java.util.Objects;

/**
 * An approval a run waits for, or waited for.
 *
 * @param runId       the run that asks
 * @param playbook    its playbook
 * @param cluster     its cluster
 * @param node        its node; null for a cluster-scoped run
 * @param requestedBy who or what asked (usually the engine)
 * @param requestedAt when it was asked
 * @param expiresAt   when it lapses unanswered
 * @param state       where it stands (stored as its {@link ApprovalState#wireName()})
 * @param decidedBy   who approved or rejected; null while pending or when lapsed
 * @param decidedAt   when it was decided or lapsed; null while pending
 * @param reasons     the guards' reasons shown to the approver, as JSON text; null if none
 */
public record ApprovalRow(String runId, String playbook, String cluster, String node, String requestedBy,
                          Instant requestedAt, Instant expiresAt, ApprovalState state, String decidedBy, Instant decidedAt,
                          String reasons) {
    public ApprovalRow {
        Objects.requireNonNull(runId, "ApprovalRow.runId must not be null");
        Objects.requireNonNull(playbook, "ApprovalRow.playbook must not be null");
        Objects.requireNonNull(cluster, "ApprovalRow.cluster must not be null");
        Objects.requireNonNull(requestedBy, "ApprovalRow.requestedBy must not be null");
        ApprovalState.requireTimes("ApprovalRow", requestedAt, expiresAt);
        Objects.requireNonNull(state, "ApprovalRow.state must not be null");
    }

    public boolean isPending() {
        return state == ApprovalState.PENDING;
    }
}
