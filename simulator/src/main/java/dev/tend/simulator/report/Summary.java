package dev.tend.simulator.report;

/**
 * The totals of a replay report. The first eight are the contract of DESIGN.md section 7;
 * the rest are extensions.
 *
 * @param runsStarted        runs that began executing steps
 * @param runsSucceeded      of those, runs that ended succeeded
 * @param runsFailed         of those, runs that ended failed
 * @param held               decisions (verdicts ledgered) whose verdict was hold
 * @param denied             decisions whose verdict was deny
 * @param approvalsRequested approvals asked for; none arrives in a replay, so each lapses or is withdrawn
 * @param maxConcurrentRuns  the most runs active at one moment
 * @param brakeEngaged       whether the fleet brake engaged at any time
 * @param runsUnfinished     started runs still not ended when the replay stopped
 * @param hiddenEvents       recorded events hidden by counterfactual masks
 * @param runsStoodDown      of the started runs, those a gate stood down before an action step
 *                           (their problem went away, or a mask or exclusion came to apply)
 */
public record Summary(long runsStarted, long runsSucceeded, long runsFailed, long held, long denied,
                      long approvalsRequested, int maxConcurrentRuns, boolean brakeEngaged,
                      long runsUnfinished, long hiddenEvents, long runsStoodDown) {
    public Summary {
        check("runs_started", runsStarted);
        check("runs_succeeded", runsSucceeded);
        check("runs_failed", runsFailed);
        check("held", held);
        check("denied", denied);
        check("approvals_requested", approvalsRequested);
        check("max_concurrent_runs", maxConcurrentRuns);
        check("runs_unfinished", runsUnfinished);
        check("hidden_events", hiddenEvents);
        check("runs_stood_down", runsStoodDown);
        if (runsSucceeded + runsFailed + runsUnfinished + runsStoodDown > runsStarted) {
            throw new IllegalArgumentException("runs_succeeded + runs_failed + runs_unfinished + runs_stood_down ("
                    + (runsSucceeded + runsFailed + runsUnfinished + runsStoodDown) + ") must not exceed runs_started (" + runsStarted + ")");
        }
    }

    private static void check(String field, long value) {
        if (value < 0) throw new IllegalArgumentException(field + " must be at least 0, got " + value);
    }
}
