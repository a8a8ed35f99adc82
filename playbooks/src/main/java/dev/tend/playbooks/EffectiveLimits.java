package dev.tend.playbooks;

import java.time.Duration;
import java.util.Objects;

/**
 * The limits that apply to a playbook once its own {@link Limits} are laid over the
 * fleet-wide defaults of {@code tend.yaml}, which are laid over the built-in defaults.
 * No field is ever null.
 *
 * <p>The built-in defaults ({@link #builtIn()}): per-cluster 1, fleet 10, per-zone 5,
 * rate 20/1h, cooldown 1h, loop 3/24h, impaired-fraction 0.34 (one node of three),
 * keep-quorum true, keep-replicas true, flapping 6/15m.
 */
public record EffectiveLimits(int perCluster, int fleet, int perZone, RateLimit rate, Duration cooldown,
                              LoopLimit loop, double impairedFraction, boolean keepQuorum, boolean keepReplicas,
                              FlapLimit flapping) {
    private static final EffectiveLimits BUILT_IN = new EffectiveLimits(1, 10, 5, new RateLimit(20, Duration.ofHours(1)),
            Duration.ofHours(1), new LoopLimit(3, Duration.ofHours(24)), 0.34, true, true,
            new FlapLimit(6, Duration.ofMinutes(15)));

    public EffectiveLimits {
        // the same rules as Limits, which checks the nullable form
        new Limits(perCluster, fleet, perZone, rate, cooldown, loop, impairedFraction, keepQuorum, keepReplicas, flapping);
        Objects.requireNonNull(rate, "limits.rate");
        Objects.requireNonNull(cooldown, "limits.cooldown");
        Objects.requireNonNull(loop, "limits.loop");
        Objects.requireNonNull(flapping, "limits.flapping");
    }

    /** The built-in defaults listed above. */
    public static EffectiveLimits builtIn() {
        return BUILT_IN;
    }

    /** A copy where every field {@code overrides} sets replaces this one's. */
    public EffectiveLimits withOverrides(Limits overrides) {
        Limits o = overrides;
        return new EffectiveLimits(
                o.perCluster() != null ? o.perCluster() : perCluster,
                o.fleet() != null ? o.fleet() : fleet,
                o.perZone() != null ? o.perZone() : perZone,
                o.rate() != null ? o.rate() : rate,
                o.cooldown() != null ? o.cooldown() : cooldown,
                o.loop() != null ? o.loop() : loop,
                o.impairedFraction() != null ? o.impairedFraction() : impairedFraction,
                o.keepQuorum() != null ? o.keepQuorum() : keepQuorum,
                o.keepReplicas() != null ? o.keepReplicas() : keepReplicas,
                o.flapping() != null ? o.flapping() : flapping);
    }

    /**
     * How many of {@code nodes} nodes the impaired-fraction lets be impaired at once:
     * floor(fraction * nodes), computed in decimal so that 0.3 * 10 is 3, not 2.
     */
    public int allowedImpaired(int nodes) {
        return ImpairedShare.allowed(impairedFraction, nodes);
    }
}
