package dev.tend.cli;

import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.SnapshotPolicy;
import picocli.CommandLine.Option;

/** {@code --snapshot-every N}: how often the driver writes a snapshot of the engine; without it, {@link Orchestrator#DEFAULT_SNAPSHOTS}. */
final class SnapshotOption {
    @Option(names = "--snapshot-every", paramLabel = "N",
            description = "write a snapshot of the engine every N inputs and at a clean stop, so that a start replays only the "
                    + "journal after it (0: never). Default: " + SnapshotPolicy.PER_SIGNAL + " inputs for each signal the engine "
                    + "knows, at least " + SnapshotPolicy.FLOOR + " and at most " + SnapshotPolicy.CAP + ": a snapshot writes "
                    + "every signal, a start replays what came after it, so the interval grows with the fleet up to what a start "
                    + "replays within seconds")
    Integer every;

    SnapshotPolicy policy() {
        if (every == null) return Orchestrator.DEFAULT_SNAPSHOTS;
        if (every < 0) throw new dev.tend.shared.TendException("--snapshot-every must be 0 (never) or more, got " + every);
        return SnapshotPolicy.every(every);
    }
}
