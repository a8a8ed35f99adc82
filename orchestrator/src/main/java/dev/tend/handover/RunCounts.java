package dev.tend.handover;

/**
 * What automation did in a period, for one playbook or the whole fleet.
 *
 * @param started   runs that began executing their steps (shadow runs never do)
 * @param succeeded runs that ended succeeded
 * @param failed    runs that ended failed
 * @param cancelled runs that ended cancelled (rejected, lapsed, withdrawn or aborted)
 * @param shadowed  runs decided in shadow mode: recorded, never executed
 * @param held      distinct candidates (playbook, cluster, node) with a hold verdict
 * @param denied    distinct candidates with a deny verdict
 * @param stoodDown runs that ended stood-down: a gate found them no longer needed before an action step
 */
public record RunCounts(int started, int succeeded, int failed, int cancelled, int shadowed, int held, int denied,
                        int stoodDown) {
    public static final RunCounts ZERO = new RunCounts(0, 0, 0, 0, 0, 0, 0, 0);

    public RunCounts {
        requireCount(started, "started");
        requireCount(succeeded, "succeeded");
        requireCount(failed, "failed");
        requireCount(cancelled, "cancelled");
        requireCount(shadowed, "shadowed");
        requireCount(held, "held");
        requireCount(denied, "denied");
        requireCount(stoodDown, "stoodDown");
    }

    /** The sum of this and {@code other}, field by field. */
    public RunCounts plus(RunCounts other) {
        return new RunCounts(started + other.started, succeeded + other.succeeded, failed + other.failed,
                cancelled + other.cancelled, shadowed + other.shadowed, held + other.held, denied + other.denied,
                stoodDown + other.stoodDown);
    }

    /** Runs that ended in the period, whatever their end. */
    public int ended() {
        return succeeded + failed + cancelled + shadowed + stoodDown;
    }

    private static void requireCount(int n, String field) {
        if (n < 0) throw new IllegalArgumentException("RunCounts." + field + " must be 0 or more, got " + n);
    }
}
