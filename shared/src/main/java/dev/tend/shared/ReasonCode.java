package dev.tend.shared;

import java.util.Locale;

/**
 * The reason codes of the guards (DESIGN.md section 4, contract), in the order the guards
 * run. Each code names the verdict it gives when its guard objects.
 */
public enum ReasonCode {
    UNKNOWN_TARGET(Verdict.DENY, "the cluster or node is not in the topology"),
    EXCLUDED(Verdict.DENY, "the target is excluded"),
    MASKED(Verdict.DENY, "an owner-caused signal explains the problem"),
    UNCONFIRMED(Verdict.HOLD, "the problem has not lasted its confirm-for yet"),
    FLAPPING(Verdict.HOLD, "the signal changes too often"),
    FLEET_BRAKE(Verdict.HOLD, "the fleet brake is engaged"),
    WINDOW_CLOSED(Verdict.HOLD, "outside the change window"),
    COOLDOWN(Verdict.HOLD, "the target was remediated recently"),
    LOOP(Verdict.DENY, "the target was remediated too often"),
    CLUSTER_BUSY(Verdict.HOLD, "another run is active on the cluster"),
    BLAST_RADIUS(Verdict.HOLD, "too many runs at once"),
    QUORUM(Verdict.HOLD, "the cluster would lose its quorum"),
    REPLICATION(Verdict.HOLD, "some data would fall below its minimum of healthy copies"),
    RATE_LIMIT(Verdict.HOLD, "the start budget is spent"),
    APPROVAL_REQUIRED(Verdict.AWAIT_APPROVAL, "the playbook asks a person for this cluster");

    private final Verdict verdict;
    private final String meaning;
    /** {@link #code()}, made once (every ledgered verdict names its codes). */
    private final String code;

    ReasonCode(Verdict verdict, String meaning) {
        this.code = name().toLowerCase(Locale.ROOT).replace('_', '-');
        this.verdict = verdict;
        this.meaning = meaning;
    }

    /** What the code means, in a few plain words for a person deciding (the console shows it beside the code). */
    public String meaning() {
        return meaning;
    }

    /** The verdict this guard gives when it objects. */
    public Verdict verdict() {
        return verdict;
    }

    /** The contract code, e.g. {@code fleet-brake}. */
    public String code() {
        return code;
    }

    public static ReasonCode parse(String code) {
        for (ReasonCode r : values()) {
            if (r.code().equals(code)) return r;
        }
        throw new IllegalArgumentException("unknown reason code '" + code + "'");
    }
}
