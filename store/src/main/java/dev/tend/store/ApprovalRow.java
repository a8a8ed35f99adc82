package dev.tend.store;

import dev.tend.shared.ApprovalState;

import java.time.Instant;
import java.util.Objects;
import java.util.Set;

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
 * @param state       one of {@link #STATES}: pending, approved, rejected, lapsed, withdrawn
 * @param decidedBy   who approved or rejected; null while pending or when lapsed
 * @param decidedAt   when it was decided or lapsed; null while pending
 * @param reasons     the guards' reasons shown to the approver, as JSON text; null if none
 */
public record ApprovalRow(String runId, String playbook, String cluster, String node, String requestedBy,
                          Instant requestedAt, Instant expiresAt, String state, String decidedBy, Instant decidedAt,
                          String reasons) {
    // the states are defined once, by ApprovalState; these are their wire names
    public static final String PENDING = ApprovalState.PENDING.wireName();
    public static final String APPROVED = ApprovalState.APPROVED.wireName();
    public static final String REJECTED = ApprovalState.REJECTED.wireName();
    public static final String LAPSED = ApprovalState.LAPSED.wireName();
    /** The problem went away, or the run was aborted, before anyone answered. */
    public static final String WITHDRAWN = ApprovalState.WITHDRAWN.wireName();
    /** Every state an approval can be in. */
    public static final Set<String> STATES = ApprovalState.wireNames();

    public ApprovalRow {
        Objects.requireNonNull(runId, "ApprovalRow.runId must not be null");
        Objects.requireNonNull(playbook, "ApprovalRow.playbook must not be null");
        Objects.requireNonNull(cluster, "ApprovalRow.cluster must not be null");
        Objects.requireNonNull(requestedBy, "ApprovalRow.requestedBy must not be null");
        Objects.requireNonNull(requestedAt, "ApprovalRow.requestedAt must not be null");
        Objects.requireNonNull(expiresAt, "ApprovalRow.expiresAt must not be null");
        if (expiresAt.isBefore(requestedAt)) {
            throw new IllegalArgumentException("ApprovalRow.expiresAt must not be before requestedAt " + requestedAt + ", got " + expiresAt);
        }
        requireState(state, "ApprovalRow.state");
    }

    /** Checks that {@code state} is one of {@link #STATES}; {@code field} names it in the message. */
    static void requireState(String state, String field) {
        Objects.requireNonNull(state, field + " must not be null");
        if (!STATES.contains(state)) {
            throw new IllegalArgumentException(field + " must be one of pending, approved, rejected, lapsed, withdrawn, got '" + state + "'");
        }
    }

    public boolean isPending() {
        return PENDING.equals(state);
    }
}
