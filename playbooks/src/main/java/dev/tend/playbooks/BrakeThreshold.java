package dev.tend.playbooks;

/**
 * A fleet brake threshold on the number of unhealthy clusters, as an absolute count, a
 * fraction of the fleet, or both. At least one is set; null means "not used".
 *
 * @param clusters at least 1 when set
 * @param fraction more than 0 and at most 1 when set
 */
public record BrakeThreshold(Integer clusters, Double fraction) {
    public BrakeThreshold {
        if (clusters == null && fraction == null) {
            throw new IllegalArgumentException("a brake threshold needs clusters, fraction or both");
        }
        if (clusters != null && clusters < 1) throw new IllegalArgumentException("brake clusters must be at least 1, got " + clusters);
        if (fraction != null && !(fraction > 0 && fraction <= 1)) {
            throw new IllegalArgumentException("brake fraction must be more than 0 and at most 1, got " + fraction);
        }
    }

    /** True when {@code unhealthy} of {@code fleetSize} clusters reaches any measure set. */
    public boolean isReached(int unhealthy, int fleetSize) {
        if (clusters != null && unhealthy >= clusters) return true;
        return fraction != null && fleetSize > 0 && (double) unhealthy / fleetSize >= fraction;
    }

    /** True when {@code unhealthy} of {@code fleetSize} clusters is below every measure set. */
    public boolean isBelow(int unhealthy, int fleetSize) {
        if (clusters != null && unhealthy >= clusters) return false;
        return fraction == null || fleetSize == 0 || (double) unhealthy / fleetSize < fraction;
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder();
        if (clusters != null) sb.append(clusters).append(clusters == 1 ? " cluster" : " clusters");
        if (fraction != null) sb.append(sb.length() > 0 ? " or " : "").append(ImpairedShare.format(fraction)).append(" of the fleet");
        return sb.toString();
    }
}
