package dev.tend.playbooks;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;

import dev.tend.shared.Id;

/**
 * Fleet-wide policy ({@code tend.yaml}): default limits, the fleet brake, freezes and the
 * fleet-wide start budget. Without a {@code tend.yaml}, {@link #builtIn()} applies:
 * {@link EffectiveLimits#builtIn()}, {@link BrakePolicy#builtIn()}, no freezes, and a fleet
 * rate of 50/1h.
 *
 * @param defaults    every limit, after laying {@code defaults:} over the built-in ones
 * @param brake       the fleet brake
 * @param freezes     in file order
 * @param rate        how many runs may start in the whole fleet per period, all playbooks together
 * @param maxSkew     how far ahead of the wall clock a live input's event time may be (default 5m)
 * @param signals     the declared signal vocabulary, in file order; empty when tend.yaml declares none
 * @param source      the file it came from, or null for the built-in policy
 * @param contentHash SHA-256 hex of that file, or null
 * @param paging      channels and where tend's own pages go
 */
public record TendConfig(EffectiveLimits defaults, BrakePolicy brake, List<Freeze> freezes, RateLimit rate,
                         Duration maxSkew, Set<Id> signals, String source, String contentHash, Paging paging) {
    public static final RateLimit BUILT_IN_FLEET_RATE = new RateLimit(50, Duration.ofHours(1));
    /** How far ahead of the wall clock a live input's event time may be, unless tend.yaml says otherwise. */
    public static final Duration DEFAULT_MAX_SKEW = Duration.ofMinutes(5);
    private static final TendConfig BUILT_IN = new TendConfig(EffectiveLimits.builtIn(), BrakePolicy.builtIn(), List.of(),
            BUILT_IN_FLEET_RATE, DEFAULT_MAX_SKEW, Set.of(), null, null, Paging.builtIn());

    public TendConfig {
        Objects.requireNonNull(defaults, "defaults");
        Objects.requireNonNull(brake, "brake");
        freezes = List.copyOf(freezes);
        Objects.requireNonNull(rate, "rate");
        Objects.requireNonNull(maxSkew, "maxSkew");
        if (maxSkew.isNegative()) throw new IllegalArgumentException("max-skew must not be negative, got " + maxSkew);
        signals = java.util.Collections.unmodifiableSet(new java.util.LinkedHashSet<>(signals));
        paging = paging == null ? Paging.builtIn() : paging;
    }

    /** A policy with the default max-skew, no declared signals and pages to the log only. */
    public TendConfig(EffectiveLimits defaults, BrakePolicy brake, List<Freeze> freezes, RateLimit rate, String source,
                      String contentHash) {
        this(defaults, brake, freezes, rate, DEFAULT_MAX_SKEW, Set.of(), source, contentHash, Paging.builtIn());
    }

    /** True when tend.yaml declares the signal vocabulary. */
    public boolean declaresSignals() {
        return !signals.isEmpty();
    }

    /** This policy with other paging settings. */
    public TendConfig withPaging(Paging p) {
        return new TendConfig(defaults, brake, freezes, rate, maxSkew, signals, source, contentHash, p);
    }

    public static TendConfig builtIn() {
        return BUILT_IN;
    }

    /** The playbook's limits laid over {@link #defaults()}; no field is null. */
    public EffectiveLimits effectiveLimits(Playbook playbook) {
        return defaults.withOverrides(playbook.limits());
    }

    /** The first freeze (in file order) that holds at {@code t} for a cluster with these tags. */
    public Optional<Freeze> freezeAt(Instant t, Map<String, String> clusterTags) {
        for (Freeze f : freezes) if (f.covers(t, clusterTags)) return Optional.of(f);
        return Optional.empty();
    }
}
