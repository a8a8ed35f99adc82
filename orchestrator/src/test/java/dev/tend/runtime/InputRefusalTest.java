package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.Input;
import dev.tend.executor.SimulatedExecutor;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** No input stops the driver: one the store cannot hold is refused on the record, and the rest goes on. */
class InputRefusalTest {
    @TempDir
    Path dir;

    private EngineSetup setup() throws Exception {
        return FixHeartbeatFixture.setup(dir);
    }

    @Test
    void aTransitionTheStoreCannotHoldIsRefusedOnTheRecordAndTheRestOfItsBatchGoesOn() throws Exception {
        EngineSetup setup = setup();
        Path db = dir.resolve("tend.db");
        Clock clock = Clock.systemUTC();
        List<String> refused = new ArrayList<>();
        Instant at = Instant.parse("2027-03-14T02:00:00Z");
        try (Store store = Store.openSqlite(db); SimulatedExecutor sim = new SimulatedExecutor(1, 100)) {
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, n -> { }, clock, new CommitListener() {
                @Override
                public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
                }

                @Override
                public void refused(Input input, String reason) {
                    refused.add(input.cluster() + ": " + reason);
                }
            });
            timers.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            orch.recover();
            orch.submitEvent(new Input.Transition(HealthTransition.of(at, "fares-1", "n1", "heartbeat", SignalState.SILENT)));
            // past 2262-04-11, the last instant the store's nanosecond times can hold
            orch.submitEvent(new Input.Transition(HealthTransition.of(Instant.parse("2263-01-01T00:00:00Z"), "fares-2", "n1",
                    "heartbeat", SignalState.SILENT)));
            orch.submitEvent(new Input.Transition(HealthTransition.of(at.plusSeconds(2), "fares-3", "n1", "heartbeat", SignalState.SILENT)));
            orch.runUntil(orch::isIdle);
            timers.close();

            assertThat(refused).hasSize(1);
            assertThat(refused.get(0)).startsWith("fares-2: ").contains("2263-01-01T00:00:00Z").contains("outside the times the store can keep");
            List<String> kinds = new ArrayList<>();
            List<String> started = new ArrayList<>();
            store.read(r -> {
                r.forEachLedger(LedgerFilter.all(), e -> {
                    kinds.add(e.kind());
                    if (e.kind().equals("run-started")) started.add(e.cluster());
                });
                return null;
            });
            assertThat(kinds).contains("input-refused");
            assertThat(started).containsExactlyInAnyOrder("fares-1", "fares-3");
            assertThat(store.read(r -> r.verifyLedger()).ok()).isTrue();
        }
        // the journal holds nothing that would stop the next start
        try (Store store = Store.openSqlite(db); SimulatedExecutor sim = new SimulatedExecutor(1, 100);
             QuartzTimers timers = new QuartzTimers(k -> { })) {
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, n -> { }, clock);
            dev.tend.runtime.Recovery rec = orch.recover();
            // from the snapshot the clean stop wrote, or from the journal: either way both good transitions are in the engine
            assertThat(rec.snapshotSeq() > 0 || rec.inputsReplayed() >= 2).as(rec.describe()).isTrue();
            assertThat(orch.engine().runs()).extracting(r -> r.target().cluster().value()).contains("fares-1", "fares-3");
        }
    }

    @Test
    void anInputRefusedAtCommitInIngestIsNamedByItsFileAndLine() throws Exception {
        EngineSetup setup = setup();
        Clock clock = Clock.systemUTC();
        java.io.StringWriter said = new java.io.StringWriter();
        dev.tend.cli.CommitRefusals refusals = new dev.tend.cli.CommitRefusals("incident.jsonl", new java.io.PrintWriter(said, true));
        Instant at = Instant.parse("2027-03-14T02:00:00Z");
        try (Store store = Store.openSqlite(dir.resolve("tend.db")); SimulatedExecutor sim = new SimulatedExecutor(1, 100)) {
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, n -> { }, clock, refusals);
            timers.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            orch.recover();
            Input good = new Input.Transition(HealthTransition.of(at, "fares-1", "n1", "heartbeat", SignalState.SILENT));
            // past 2262-04-11, the last instant the store's nanosecond times can hold
            Input bad = new Input.Transition(HealthTransition.of(Instant.parse("2263-01-01T00:00:00Z"), "fares-2", "n1",
                    "heartbeat", SignalState.SILENT));
            refusals.submitted(good, 3);
            orch.submitEvent(good);
            refusals.submitted(bad, 7);
            orch.submitEvent(bad);
            orch.runUntil(orch::isIdle);
            timers.close();
        }
        assertThat(refusals.count()).isEqualTo(1);
        assertThat(said.toString().lines()).singleElement().asString()
                .startsWith("incident.jsonl:7: refused a transition input of fares-2 at commit")
                .contains("2263-01-01T00:00:00Z");
    }
}
