package dev.tend.playbooks;

import java.time.Duration;

/**
 * The {@code limits} of a playbook, or the {@code defaults} of {@code tend.yaml}, as
 * written. Every field may be null, meaning "not set here": the fleet-wide default applies
 * (see {@link EffectiveLimits#withOverrides(Limits)}).
 *
 * @param perCluster       runs of this playbook active at once on one cluster, at least 1
 * @param fleet            runs of this playbook active at once in the whole fleet, at least 1
 * @param perZone          runs of this playbook active at once in one zone, at least 1
 * @param rate             the playbook's start budget
 * @param cooldown         how long after a run on a target before the next one may start there
 * @param loop             at most this many runs on one target within the period, then deny
 * @param impairedFraction the largest share of a cluster's nodes that may be impaired
 *                         (unhealthy or under remediation) at once; more than 0, at most 1
 * @param keepQuorum       hold a run that would cost a majority-quorum ensemble its majority
 * @param keepReplicas     hold a run that would leave some data with fewer than min-healthy healthy copies
 * @param flapping         above this many state changes in the period a signal is flapping
 */
public record Limits(Integer perCluster, Integer fleet, Integer perZone, RateLimit rate, Duration cooldown,
                     LoopLimit loop, Double impairedFraction, Boolean keepQuorum, Boolean keepReplicas,
                     FlapLimit flapping) {
    private static final Limits NONE = new Limits(null, null, null, null, null, null, null, null, null, null);

    public Limits {
        atLeastOne("per-cluster", perCluster);
        atLeastOne("fleet", fleet);
        atLeastOne("per-zone", perZone);
        if (cooldown != null && cooldown.isNegative()) {
            throw new IllegalArgumentException("limits.cooldown must not be negative, got " + cooldown);
        }
        if (impairedFraction != null && !(impairedFraction > 0 && impairedFraction <= 1)) {
            throw new IllegalArgumentException("limits.impaired-fraction must be more than 0 and at most 1, got " + impairedFraction);
        }
    }

    /** Limits that set nothing. */
    public static Limits none() {
        return NONE;
    }

    public static Builder builder() {
        return new Builder();
    }

    private static void atLeastOne(String field, Integer value) {
        if (value != null && value < 1) throw new IllegalArgumentException("limits." + field + " must be at least 1, got " + value);
    }

    /** Builds {@link Limits}; every field starts unset (null). */
    public static final class Builder {
        private Integer perCluster;
        private Integer fleet;
        private Integer perZone;
        private RateLimit rate;
        private Duration cooldown;
        private LoopLimit loop;
        private Double impairedFraction;
        private Boolean keepQuorum;
        private Boolean keepReplicas;
        private FlapLimit flapping;

        private Builder() {
        }

        public Builder perCluster(Integer v) { perCluster = v; return this; }

        public Builder fleet(Integer v) { fleet = v; return this; }

        public Builder perZone(Integer v) { perZone = v; return this; }

        public Builder rate(RateLimit v) { rate = v; return this; }

        public Builder cooldown(Duration v) { cooldown = v; return this; }

        public Builder loop(LoopLimit v) { loop = v; return this; }

        public Builder impairedFraction(Double v) { impairedFraction = v; return this; }

        public Builder keepQuorum(Boolean v) { keepQuorum = v; return this; }

        public Builder keepReplicas(Boolean v) { keepReplicas = v; return this; }

        public Builder flapping(FlapLimit v) { flapping = v; return this; }

        /** Validates as the record constructor does. */
        public Limits build() {
            return new Limits(perCluster, fleet, perZone, rate, cooldown, loop, impairedFraction, keepQuorum, keepReplicas, flapping);
        }
    }
}
