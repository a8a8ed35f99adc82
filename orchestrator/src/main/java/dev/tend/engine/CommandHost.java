package dev.tend.engine;

import dev.tend.engine.run.RunProcess;
import dev.tend.shared.Id;

/** What the operator commands ({@link OperatorCommands}) need from the engine around them, and nothing more. */
interface CommandHost {
    /** The run {@code id}, or null when there is none. */
    RunProcess run(String id);

    /** Looks at the candidate {@code key} again before the input is done. */
    void queue(Candidate.Key key);

    /** Looks at every candidate on {@code cluster} again before the input is done. */
    void queueCluster(Id cluster);

    /** The brake was released: held candidates and paused runs may go on. */
    void brakeReleased(Effects fx);
}
