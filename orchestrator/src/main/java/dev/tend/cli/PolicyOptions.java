package dev.tend.cli;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.LedgerKind;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.replay.ActionOverrides;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import picocli.CommandLine.Option;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/** {@code --playbooks DIR --fleet FILE [--config FILE]}: what an engine is built from. */
final class PolicyOptions {
    @Option(names = "--playbooks", paramLabel = "DIR", required = true,
            description = "playbook directory with actions.yaml (and tend.yaml unless --config)")
    Path playbooks;

    @Option(names = "--fleet", paramLabel = "FILE", required = true, description = "fleet file (YAML or JSON)")
    Path fleet;

    @Option(names = "--config", paramLabel = "FILE", description = "fleet-wide policy (default: DIR/tend.yaml if present)")
    Path config;

    @Option(names = "--actions", paramLabel = "FILE", description = ACTIONS_HELP)
    Path actions;

    /** What {@code --actions FILE} means, in every command that has it. */
    static final String ACTIONS_HELP = "an actions.yaml laid over DIR/actions.yaml: its actions replace those of the same id,"
            + " the others stay (say, command actions for live use over the simulated ones)";

    EngineSetup setup(EventTimeMode mode) {
        PlaybookSet set = withActions(PlaybookLoader.load(playbooks, config), actions);
        Fleet f = FleetFile.load(fleet);
        return new EngineSetup(set, set.config(), f, BrakeThresholds.from(set.config().brake()), mode);
    }

    /** {@code set} with the actions of {@code actionsFile} laid over its own; {@code set} itself when null. */
    static PlaybookSet withActions(PlaybookSet set, Path actionsFile) {
        return actionsFile == null ? set : ActionOverrides.apply(set, PlaybookLoader.loadActions(actionsFile));
    }

    /** The ledger fields recording which policy was loaded (each playbook's content hash). */
    static Map<String, Object> loaded(EngineSetup setup) {
        Map<String, Object> hashes = new LinkedHashMap<>();
        for (Playbook p : setup.playbooks().playbooks()) hashes.put(p.id().value(), "v" + p.version() + " sha256:" + p.contentHash());
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("playbooks", hashes);
        m.put("actions", "sha256:" + setup.playbooks().actions().contentHash());
        m.put("clusters", setup.fleet().size());
        return LedgerKind.POLICY_LOADED.check(m);
    }
}
