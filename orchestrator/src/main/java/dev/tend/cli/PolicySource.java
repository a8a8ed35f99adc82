package dev.tend.cli;

import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.replay.ActionOverrides;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/**
 * {@code --playbooks DIR [--config FILE] [--actions FILE]}: the policy an engine decides by,
 * declared once for every command that loads one ({@link PolicyOptions} adds the fleet).
 */
class PolicySource {
    /** What {@code --actions FILE} means, in every command that has it. */
    static final String ACTIONS_HELP = "an actions.yaml laid over DIR/actions.yaml: its actions replace those of the same id,"
            + " the others stay (say, command actions for live use over the simulated ones)";

    @Option(names = "--playbooks", paramLabel = "DIR", required = true,
            description = "playbook directory with actions.yaml (and tend.yaml unless --config)")
    Path playbooks;

    @Option(names = "--config", paramLabel = "FILE", description = "fleet-wide policy (default: DIR/tend.yaml if present)")
    Path config;

    @Option(names = "--actions", paramLabel = "FILE", description = ACTIONS_HELP)
    Path actions;

    /** The playbooks of {@code --playbooks DIR}, with {@code --config} and {@code --actions}. */
    PlaybookSet load() {
        return load(playbooks);
    }

    /** The playbooks of {@code dir} (another directory, say replay's {@code --against}) with the same {@code --config} and {@code --actions}. */
    PlaybookSet load(Path dir) {
        return withActions(PlaybookLoader.load(dir, config), actions);
    }

    /** {@code set} with the actions of {@code actionsFile} laid over its own; {@code set} itself when null. */
    static PlaybookSet withActions(PlaybookSet set, Path actionsFile) {
        return actionsFile == null ? set : ActionOverrides.apply(set, PlaybookLoader.loadActions(actionsFile));
    }
}
