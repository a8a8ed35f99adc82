package dev.tend.handover;

import dev.tend.shared.ApprovalState;

import java.time.Instant;
import java.util.Objects;

/**
 * One approval as the ledger shows it at the end of a report's period.
 *
 * @param run         the run that asks
 * @param playbook    its playbook
 * @param cluster     its cluster
 * @param node        its node; null for a cluster-scoped run
 * @param requestedAt when a person was asked
 * @param expiresAt   when it lapses unanswered; not before {@code requestedAt}
 * @param state       the wire name of an {@link ApprovalState}: still pending at the period's end, or how it was settled
 *                    ({@code withdrawn}: the run ended, e.g. the problem went away, before anyone answered)
 * @param decidedBy   who approved or rejected; null otherwise
 * @param decidedAt   when it was settled; null while pending
 */
public record ApprovalLine(String run, String playbook, String cluster, String node, Instant requestedAt, Instant expiresAt,
                           String state, String decidedBy, Instant decidedAt) {

    public ApprovalLine {
        Objects.requireNonNull(run, "ApprovalLine.run must not be null");
        Objects.requireNonNull(playbook, "ApprovalLine.playbook must not be null");
        Objects.requireNonNull(cluster, "ApprovalLine.cluster must not be null");
        ApprovalState.requireTimes("ApprovalLine", requestedAt, expiresAt);
        Objects.requireNonNull(state, "ApprovalLine.state must not be null");
        if (ApprovalState.of(state).isEmpty()) {
            throw new IllegalArgumentException("ApprovalLine.state must be one of pending, approved, rejected, lapsed, withdrawn, got '"
                    + state + "'");
        }
        if (ApprovalState.PENDING.wireName().equals(state) != (decidedAt == null)) {
            throw new IllegalArgumentException("ApprovalLine.decidedAt must be null exactly while pending; state '" + state
                    + "', decidedAt " + decidedAt);
        }
        if (decidedAt != null && decidedAt.isBefore(requestedAt)) {
            throw new IllegalArgumentException("ApprovalLine.decidedAt must not be before requestedAt " + requestedAt + ", got " + decidedAt);
        }
    }

    public boolean isPending() {
        return ApprovalState.PENDING.wireName().equals(state);
    }

    /** Pending although its expiry passed before {@code t}: no lapse was recorded (tend was not running then). */
    public boolean isOverdueAt(Instant t) {
        return isPending() && !expiresAt.isAfter(t);
    }

    /** "cluster/node", or the cluster for a cluster-scoped run. */
    public String target() {
        return node == null ? cluster : cluster + "/" + node;
    }
}
