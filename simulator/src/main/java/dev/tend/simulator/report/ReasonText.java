package dev.tend.simulator.report;

import dev.tend.shared.ReasonCode;

/**
 * A reason code in a few words, printed beside the code itself in the text and HTML
 * reports (the code stays the word: "masked" is always the guard's reason, never another
 * kind of hiding). The meanings are DESIGN.md section 4's.
 */
final class ReasonText {
    private ReasonText() {
    }

    static String gloss(ReasonCode code) {
        return switch (code) {
            case UNKNOWN_TARGET -> "the target is not in the fleet's topology";
            case EXCLUDED -> "the target is on the exclusion list";
            case MASKED -> "another active signal on the target explains this one";
            case UNCONFIRMED -> "the problem had not lasted confirm-for yet";
            case FLAPPING -> "the signal changed state too often recently";
            case FLEET_BRAKE -> "too many clusters unhealthy at once";
            case WINDOW_CLOSED -> "outside the change window, or inside a freeze";
            case COOLDOWN -> "this playbook remediated the target too recently";
            case LOOP -> "the target was remediated too many times in the window";
            case CLUSTER_BUSY -> "another run was active on the cluster";
            case BLAST_RADIUS -> "the run would impair too much of the cluster, or exceed a zone or fleet cap";
            case QUORUM -> "a majority-quorum ensemble would lose its majority";
            case REPLICATION -> "data would fall below its healthy copies";
            case RATE_LIMIT -> "the playbook's or the fleet's start budget was spent";
            case APPROVAL_REQUIRED -> "policy asks a person to approve";
        };
    }
}
