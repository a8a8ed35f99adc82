package dev.tend.replay;

import dev.tend.shared.Problem;

/** Hears about a replay while it runs: bad lines of the recording, and progress. Called on the replaying thread. */
public interface ReplayListener {
    ReplayListener SILENT = new ReplayListener() {
    };

    /** A line of the recording was rejected and skipped. */
    default void problem(Problem problem) {
    }

    /** {@code bytesRead} of the recording's {@code bytesTotal}, {@code events} events, have been fed; called now and then. */
    default void progress(long bytesRead, long bytesTotal, long events) {
    }

    /** The recording has been fed; virtual time runs on to the horizon. */
    default void done() {
    }
}
