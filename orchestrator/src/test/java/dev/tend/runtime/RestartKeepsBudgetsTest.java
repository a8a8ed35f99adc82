package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.executor.SimulatedExecutor;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class RestartKeepsBudgetsTest {
    @TempDir
    Path dir;

    @Test
    void aRestartGrantsNoFreshBurstTheBudgetIsRebuiltFromRecordedStarts() throws Exception {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  fix: { simulated: { duration: 1s, success: 1.0 } }\n");
        Files.writeString(dir.resolve("tend.yaml"), "defaults: { rate: 2/1h, fleet: 50, per-zone: 50 }\n"
                + "brake: { engage-at: { clusters: 100 }, release-below: { clusters: 50 } }\n");
        Files.writeString(dir.resolve("fix.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits: { keep-replicas: false }
                steps:
                  - { id: fix, action: fix, timeout: 1m }
                """);
        StringBuilder fleet = new StringBuilder("fleet: larkspur\nclusters:\n");
        for (int c = 1; c <= 6; c++) fleet.append("  - id: fares-").append(c).append("\n    nodes: [ { id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c } ]\n");
        Files.writeString(dir.resolve("fleet.yaml"), fleet);
        Path db = dir.resolve("tend.db");

        ingest(db, 1, 2, 3);   // two start, the third is held by the playbook's budget
        ingest(db, 4);         // a fresh process on the same store: still no permit

        try (Store store = Store.openSqlite(db)) {
            List<String> verdicts = new ArrayList<>();
            store.read(r -> {
                r.forEachLedger(LedgerFilter.all().withKind("verdict"), e -> verdicts.add(e.cluster() + " "
                        + (e.entry().contains("\"verdict\":\"start\"") ? "start" : e.entry().contains("rate-limit") ? "rate-limit" : "other")));
                return null;
            });
            assertThat(verdicts).containsExactly("fares-1 start", "fares-2 start", "fares-3 rate-limit", "fares-4 rate-limit");
        }
    }

    private void ingest(Path db, int... clusters) throws Exception {
        PlaybookSet set = PlaybookLoader.load(dir);
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.eventsOnly());
        Clock clock = Clock.systemUTC();
        try (Store store = Store.openSqlite(db); SimulatedExecutor sim = new SimulatedExecutor(1, 100)) {
            Orchestrator[] holder = new Orchestrator[1];
            ScheduledTimers timers = new ScheduledTimers(clock, k -> holder[0].submit(new Input.TimerFired(k)));
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, n -> { }, clock);
            holder[0] = orch;
            orch.recover();
            Instant at = Instant.parse("2027-03-14T02:00:00Z");
            for (int c : clusters) {
                orch.submitEvent(new Input.Transition(HealthTransition.of(at.plusSeconds(c), "fares-" + c, "n1", "heartbeat", SignalState.SILENT)));
            }
            orch.runUntil(orch::isIdle);
            timers.close();
        }
    }
}
