package dev.tend.engine;

import dev.tend.shared.ApprovalState;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.List;

/**
 * An approval request and its answer.
 *
 * @param state where it stands
 */
public record ApprovalSnapshot(String runId, String playbook, Target target, String requestedBy, Instant requestedAt,
                               Instant expiresAt, ApprovalState state, String decidedBy, Instant decidedAt, List<String> reasons) {
    public ApprovalSnapshot {
        reasons = List.copyOf(reasons);
    }
}
