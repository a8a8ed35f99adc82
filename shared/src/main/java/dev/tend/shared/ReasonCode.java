package dev.tend.shared;

import java.util.Locale;

/**
 * The reason codes of the guards (DESIGN.md section 4, contract), in the order the guards
 * run. Each code names the verdict it gives when its guard objects.
 */
public enum ReasonCode {
    UNKNOWN_TARGET(Verdict.DENY),
    EXCLUDED(Verdict.DENY),
    MASKED(Verdict.DENY),
    UNCONFIRMED(Verdict.HOLD),
    FLAPPING(Verdict.HOLD),
    FLEET_BRAKE(Verdict.HOLD),
    WINDOW_CLOSED(Verdict.HOLD),
    COOLDOWN(Verdict.HOLD),
    LOOP(Verdict.DENY),
    CLUSTER_BUSY(Verdict.HOLD),
    BLAST_RADIUS(Verdict.HOLD),
    QUORUM(Verdict.HOLD),
    REPLICATION(Verdict.HOLD),
    RATE_LIMIT(Verdict.HOLD),
    APPROVAL_REQUIRED(Verdict.AWAIT_APPROVAL);

    private final Verdict verdict;

    ReasonCode(Verdict verdict) {
        this.verdict = verdict;
    }

    /** The verdict this guard gives when it objects. */
    public Verdict verdict() {
        return verdict;
    }

    /** The contract code, e.g. {@code fleet-brake}. */
    public String code() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }

    public static ReasonCode parse(String code) {
        for (ReasonCode r : values()) {
            if (r.code().equals(code)) return r;
        }
        throw new IllegalArgumentException("unknown reason code '" + code + "'");
    }
}
