package dev.tend.cli;

import dev.tend.runtime.Orchestrator;
import picocli.CommandLine.Option;

/** {@code --snapshot-every N}: how often the driver writes a snapshot of the engine. */
final class SnapshotOption {
    @Option(names = "--snapshot-every", paramLabel = "N", defaultValue = "" + Orchestrator.DEFAULT_SNAPSHOT_EVERY,
            description = "write a snapshot of the engine every N inputs and at a clean stop, so that a start replays only the "
                    + "journal after it (default: ${DEFAULT-VALUE}; 0: never)")
    int every;

    int every() {
        if (every < 0) throw new dev.tend.shared.TendException("--snapshot-every must be 0 (never) or more, got " + every);
        return every;
    }
}
