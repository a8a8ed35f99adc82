package dev.tend.cli;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.LedgerKind;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.Futures;
import dev.tend.shared.fleet.FleetFile;
import picocli.CommandLine.Option;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.CompletableFuture;

/**
 * {@code --playbooks DIR --fleet FILE [--config FILE] [--actions FILE]}: what an engine is
 * built from (the policy of {@link PolicySource} and the fleet).
 */
final class PolicyOptions extends PolicySource {
    @Option(names = "--fleet", paramLabel = "FILE", required = true, description = "fleet file (YAML or JSON)")
    Path fleet;

    EngineSetup setup(EventTimeMode mode) {
        // The fleet file is read on a thread of its own while the playbooks are read here: on a fleet of
        // 2,000 clusters it took 0.2 s of a start and the playbooks 0.1 s (DEVELOPERS.md, "Ingest").
        // A fault in the playbooks is still the one reported when both are at fault.
        CompletableFuture<Fleet> reading = Futures.onThread("tend-fleet-read", () -> FleetFile.load(fleet));
        PlaybookSet set = load();
        Fleet f = Futures.joined(reading);
        return new EngineSetup(set, set.config(), f, BrakeThresholds.from(set.config().brake()), mode);
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
