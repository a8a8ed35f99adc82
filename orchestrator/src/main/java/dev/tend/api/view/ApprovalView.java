package dev.tend.api.view;

import java.time.Instant;
import java.util.List;

/**
 * An approval a run waits for or waited for.
 *
 * @param state   pending, approved, rejected, lapsed or withdrawn
 * @param reasons the guards' reason codes when the approval was requested
 */
public record ApprovalView(String run, String playbook, String cluster, String node, String state, String requestedBy,
                           Instant requestedAt, Instant expiresAt, String decidedBy, Instant decidedAt,
                           List<String> reasons) {
    public ApprovalView {
        reasons = reasons == null ? List.of() : List.copyOf(reasons);
    }
}
