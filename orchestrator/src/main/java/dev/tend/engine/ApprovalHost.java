package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.engine.run.RunProcess;

import java.time.Duration;

/** What the approval flow ({@link Approvals}) needs from the engine around it, and nothing more. */
interface ApprovalHost {
    /** Who automation's own requests are made by (for the two-person rule). */
    String AUTOMATION = "automation";

    /** A new run of candidate {@code c} in {@code state}, requested by {@code requestedBy}. */
    RunProcess newRun(Candidate c, RunState state, String requestedBy);

    /** The run {@code id}, or null when there is none. */
    RunProcess run(String id);

    /** Looks at the candidate {@code key} again before the input is done. */
    void queue(Candidate.Key key);

    /** The channel of tend's own pages. */
    String pageChannel();

    /** How long before an approval lapses its reminder goes out; zero for none. */
    Duration approvalReminder();
}
