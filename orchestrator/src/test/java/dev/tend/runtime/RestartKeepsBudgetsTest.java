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
        FixHeartbeatFixture.write(dir, "defaults: { rate: 2/1h, fleet: 50, per-zone: 50 }\n" + FixHeartbeatFixture.BRAKE, 6);
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

    @Test
    void twelveProblemsFiveMinutesApartUnderThreePerHourNeverStartMoreThanThreeInAnyRollingHourAcrossRestarts() throws Exception {
        Files.writeString(dir.resolve("actions.yaml"), "actions:\n  fix: { simulated: { duration: 1s, success: 1.0 } }\n");
        Files.writeString(dir.resolve("tend.yaml"), "defaults: { rate: 3/1h, fleet: 50, per-zone: 50, cooldown: 0s }\n"
                + "brake: { engage-at: { clusters: 100 }, release-below: { clusters: 50 } }\n");
        Files.writeString(dir.resolve("fix.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: fix, action: fix, timeout: 1m }
                """);
        StringBuilder fleet = new StringBuilder("fleet: larkspur\nclusters:\n");
        for (int c = 1; c <= 12; c++) fleet.append("  - id: fares-").append(c).append("\n    nodes: [ { id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c } ]\n");
        Files.writeString(dir.resolve("fleet.yaml"), fleet);
        Path db = dir.resolve("tend.db");
        Instant t0 = Instant.parse("2026-03-14T02:00:00Z");
        SteppedServe serve = new SteppedServe(db);
        for (int i = 0; i < 12; i++) {
            if (i % 4 == 0) serve.restart(); // a fresh process on the same store every 20 minutes
            serve.at(t0.plus(java.time.Duration.ofMinutes(5L * i)), "fares-" + (i + 1));
        }
        for (int m = 60; m <= 240; m += 5) {
            if (m % 60 == 30) serve.restart();
            serve.at(t0.plus(java.time.Duration.ofMinutes(m)), null);
        }
        serve.close();
        try (Store store = Store.openSqlite(db)) {
            List<Instant> starts = new ArrayList<>();
            for (var run : store.read(r -> r.runs(dev.tend.store.RunFilter.all().withLimit(100)))) starts.add(run.startedAt());
            starts.sort(null);
            assertThat(starts).hasSize(12);
            for (int i = 0; i + 3 < starts.size(); i++) {
                assertThat(java.time.Duration.between(starts.get(i), starts.get(i + 3))).as("starts %s", starts)
                        .isGreaterThanOrEqualTo(java.time.Duration.ofHours(1));
            }
        }
    }

    /**
     * The driver of {@code tend serve} on one store, in stepped processing time: each step sets
     * the clock, fires the timers due by then, feeds at most one transition and runs until idle.
     */
    private final class SteppedServe implements AutoCloseable {
        private final Path db;
        private final java.util.TreeMap<String, Instant> armed = new java.util.TreeMap<>();
        private Instant now = Instant.parse("2026-03-14T01:00:00Z");
        private final Clock clock = new Clock() {
            @Override public java.time.ZoneId getZone() { return java.time.ZoneOffset.UTC; }
            @Override public Clock withZone(java.time.ZoneId zone) { return this; }
            @Override public Instant instant() { return now; }
        };
        private Store store;
        private SimulatedExecutor sim;
        private Orchestrator orch;

        SteppedServe(Path db) {
            this.db = db;
        }

        void restart() {
            close();
            PlaybookSet set = PlaybookLoader.load(dir);
            EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")),
                    BrakeThresholds.from(set.config().brake()), EventTimeMode.eventsOnly());
            store = Store.openSqlite(db);
            sim = new SimulatedExecutor(1, 1000);
            armed.clear();
            orch = new Orchestrator(store, setup, Map.of("simulated", sim), new dev.tend.shared.time.Timers() {
                @Override public void arm(String key, Instant due) { armed.put(key, due); }
                @Override public void cancel(String key) { armed.remove(key); }
            }, n -> { }, clock);
            orch.recover();
        }

        void at(Instant t, String silentCluster) throws InterruptedException {
            now = t;
            for (var e : new ArrayList<>(armed.entrySet())) {
                if (!e.getValue().isAfter(t)) {
                    armed.remove(e.getKey());
                    orch.submit(new Input.TimerFired(e.getKey()));
                }
            }
            if (silentCluster != null) {
                orch.submitEvent(new Input.Transition(HealthTransition.of(t, silentCluster, "n1", "heartbeat", SignalState.SILENT)));
            }
            orch.runUntil(orch::isIdle);
        }

        @Override
        public void close() {
            if (store != null) store.close();
            if (sim != null) sim.close();
            store = null;
            sim = null;
        }
    }

    private void ingest(Path db, int... clusters) throws Exception {
        PlaybookSet set = PlaybookLoader.load(dir);
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.eventsOnly());
        Clock clock = Clock.systemUTC();
        try (Store store = Store.openSqlite(db); SimulatedExecutor sim = new SimulatedExecutor(1, 100)) {
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, n -> { }, clock);
            timers.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            orch.recover();
            Instant at = Instant.parse("2026-03-14T02:00:00Z");
            for (int c : clusters) {
                orch.submitEvent(new Input.Transition(HealthTransition.of(at.plusSeconds(c), "fares-" + c, "n1", "heartbeat", SignalState.SILENT)));
            }
            orch.runUntil(orch::isIdle);
            timers.close();
        }
    }
}
