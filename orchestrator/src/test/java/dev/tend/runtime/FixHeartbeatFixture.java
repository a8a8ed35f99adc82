package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.FleetFile;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The driver tests' policy folder: one playbook (fix-heartbeat: a silent node gets a one-step
 * simulated fix that always succeeds), the given {@code tend.yaml}, and an invented fleet of
 * {@code fares-1} to {@code fares-N}, each with three nodes in three zones.
 */
final class FixHeartbeatFixture {
    /** A brake that no test's few clusters reach. */
    static final String BRAKE = "brake: { engage-at: { clusters: 100 }, release-below: { clusters: 50 } }\n";

    private FixHeartbeatFixture() {
    }

    static void write(Path dir, String tendYaml, int clusters) throws IOException {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  fix: { simulated: { duration: 1s, success: 1.0 } }\n");
        Files.writeString(dir.resolve("tend.yaml"), tendYaml);
        Files.writeString(dir.resolve("fix.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits: { keep-replicas: false }
                steps:
                  - { id: fix, action: fix, timeout: 1m }
                """);
        StringBuilder fleet = new StringBuilder("fleet: larkspur\nclusters:\n");
        for (int c = 1; c <= clusters; c++) {
            fleet.append("  - id: fares-").append(c).append("\n    nodes: [ { id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c } ]\n");
        }
        Files.writeString(dir.resolve("fleet.yaml"), fleet);
    }

    /** {@link #write} with only {@link #BRAKE} in {@code tend.yaml} and four clusters, loaded as the engine's setup (event time from the events alone). */
    static EngineSetup setup(Path dir) throws Exception {
        write(dir, BRAKE, 4);
        PlaybookSet set = PlaybookLoader.load(dir);
        return new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.eventsOnly());
    }
}
