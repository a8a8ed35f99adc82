package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.util.Objects;

/**
 * The fleet brake: once {@code engageAt} is reached, all automatic starts stop and one
 * aggregated page goes to {@code pageChannel} ({@code page:} in tend.yaml). It is released by hand, or, with
 * {@code autoRelease}, once the count is below {@code releaseBelow}, which is lower than
 * {@code engageAt} in every measure it gives (hysteresis: the brake does not chatter).
 *
 * <p>The built-in policy ({@link #builtIn()}): engage at 20 clusters, release below 10,
 * release by hand only, page {@code oncall}.
 *
 * @param releaseBelow null only when {@code autoRelease} is false
 */
public record BrakePolicy(BrakeThreshold engageAt, BrakeThreshold releaseBelow, boolean autoRelease, Id pageChannel,
                          java.time.Duration releaseAfter) {
    /** How long the fleet must stay below release-below before an automatic release, unless set. */
    public static final java.time.Duration DEFAULT_RELEASE_AFTER = java.time.Duration.ofMinutes(5);

    private static final BrakePolicy BUILT_IN = new BrakePolicy(new BrakeThreshold(20, null), new BrakeThreshold(10, null),
            false, Id.of("oncall"));

    public BrakePolicy(BrakeThreshold engageAt, BrakeThreshold releaseBelow, boolean autoRelease, Id pageChannel) {
        this(engageAt, releaseBelow, autoRelease, pageChannel, DEFAULT_RELEASE_AFTER);
    }

    public BrakePolicy {
        Objects.requireNonNull(engageAt, "brake.engage-at");
        Objects.requireNonNull(releaseAfter, "brake.release-after");
        if (releaseAfter.isNegative()) throw new IllegalArgumentException("brake.release-after must not be negative, got " + releaseAfter);
        Objects.requireNonNull(pageChannel, "brake.page");
        if (autoRelease && releaseBelow == null) {
            throw new IllegalArgumentException("brake.auto-release needs brake.release-below: without it the brake would never know when to let go");
        }
        if (releaseBelow != null) checkHysteresis(engageAt, releaseBelow);
    }

    public static BrakePolicy builtIn() {
        return BUILT_IN;
    }

    /**
     * Checks that {@code release} sets only measures that {@code engage} sets, each lower.
     * Throws {@link IllegalArgumentException} with a sentence naming the measure.
     */
    public static void checkHysteresis(BrakeThreshold engage, BrakeThreshold release) {
        if (release.clusters() != null) {
            if (engage.clusters() == null) {
                throw new IllegalArgumentException("brake.release-below.clusters has no engage-at.clusters to be lower than; give both or neither");
            }
            if (release.clusters() >= engage.clusters()) {
                throw new IllegalArgumentException("brake.release-below.clusters (" + release.clusters()
                        + ") must be lower than engage-at.clusters (" + engage.clusters() + "), or the brake would release as soon as it engages");
            }
        }
        if (release.fraction() != null) {
            if (engage.fraction() == null) {
                throw new IllegalArgumentException("brake.release-below.fraction has no engage-at.fraction to be lower than; give both or neither");
            }
            if (release.fraction() >= engage.fraction()) {
                throw new IllegalArgumentException("brake.release-below.fraction (" + ImpairedShare.format(release.fraction())
                        + ") must be lower than engage-at.fraction (" + ImpairedShare.format(engage.fraction())
                        + "), or the brake would release as soon as it engages");
            }
        }
    }

    /** True when {@code unhealthy} of {@code fleetSize} clusters should engage the brake. */
    public boolean shouldEngage(int unhealthy, int fleetSize) {
        return engageAt.isReached(unhealthy, fleetSize);
    }

    /** True when an engaged brake releases by itself at this count. */
    public boolean shouldAutoRelease(int unhealthy, int fleetSize) {
        return autoRelease && releaseBelow.isBelow(unhealthy, fleetSize);
    }
}
