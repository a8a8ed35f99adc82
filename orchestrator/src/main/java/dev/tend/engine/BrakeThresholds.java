package dev.tend.engine;

/**
 * When the fleet brake engages and releases by itself. Engages when the unhealthy clusters
 * reach {@code engageClusters} or their share reaches {@code engageFraction} (either may be
 * null: not used); releases automatically, if {@code autoRelease}, once both are below the
 * release thresholds (hysteresis) and stayed there for {@code settle}, so that a recovery
 * still arriving does not release it half-way. {@code channel} receives the one aggregated page.
 */
public record BrakeThresholds(Integer engageClusters, Double engageFraction, Integer releaseClusters,
                              Double releaseFraction, boolean autoRelease, String channel, java.time.Duration settle) {
    /** How long the fleet must stay below the release thresholds before the brake releases by itself. */
    public static final java.time.Duration DEFAULT_SETTLE = java.time.Duration.ofMinutes(5);

    public BrakeThresholds {
        if (settle == null || settle.isNegative()) throw new IllegalArgumentException("brake settle time must be zero or more, got " + settle);
    }

    /** The thresholds of a tend.yaml brake policy. */
    public static BrakeThresholds from(dev.tend.playbooks.BrakePolicy p) {
        return new BrakeThresholds(p.engageAt() == null ? null : p.engageAt().clusters(),
                p.engageAt() == null ? null : p.engageAt().fraction(),
                p.releaseBelow() == null ? null : p.releaseBelow().clusters(),
                p.releaseBelow() == null ? null : p.releaseBelow().fraction(),
                p.autoRelease(), p.pageChannel() == null ? "oncall" : p.pageChannel().value(), p.releaseAfter());
    }

    public static BrakeThresholds never() {
        return new BrakeThresholds(null, null, null, null, false, "oncall", DEFAULT_SETTLE);
    }

    boolean shouldEngage(int unhealthy, double fraction) {
        return (engageClusters != null && unhealthy >= engageClusters)
                || (engageFraction != null && fraction >= engageFraction);
    }

    boolean mayRelease(int unhealthy, double fraction) {
        boolean byCount = releaseClusters == null ? engageClusters == null || unhealthy < engageClusters : unhealthy < releaseClusters;
        boolean byFraction = releaseFraction == null ? engageFraction == null || fraction < engageFraction : fraction < releaseFraction;
        return byCount && byFraction;
    }
}
