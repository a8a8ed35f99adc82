package dev.tend.api.view;

import java.util.List;

/**
 * What an approve or reject did: the approval and the run as committed, and the verdict the
 * guards gave when they were checked again (null when they were not: a rejection).
 */
public record ApprovalOutcome(ApprovalView approval, RunView run, String verdict, List<String> reasons) {
    public ApprovalOutcome {
        reasons = reasons == null ? List.of() : List.copyOf(reasons);
    }
}
