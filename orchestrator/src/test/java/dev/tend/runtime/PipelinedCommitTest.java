package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.Input;
import dev.tend.executor.Executor;
import dev.tend.executor.SimulatedExecutor;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.time.Timers;
import dev.tend.store.LedgerFilter;
import dev.tend.store.SnapshotRow;
import dev.tend.store.StepRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;
import dev.tend.store.TimerRow;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.CompletableFuture;
import java.util.function.Consumer;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The driver commits batches on a thread of its own while it decides the next ones (two in
 * flight at most): every side effect still follows its own commit, in the order of the
 * inputs, and a commit that fails with later batches already decided has them all redone
 * input by input, while the batches committed before it keep their effects.
 */
class PipelinedCommitTest {
    /** The driver's batches here (it takes far more at once when that many wait). */
    private static final int BATCH = 2000;
    /** Four batches and a smaller one, all queued before the driver starts. */
    private static final int INPUTS = 8500;
    private static final Instant AT = Instant.parse("2027-03-14T02:00:00Z");

    @TempDir
    Path dir;

    @Test
    void aCommitThatFailsWhileLaterBatchesAreDecidedHasThemAllRedoneOneByOneAndNoEffectPrecedesItsCommit() throws Exception {
        List<Input> inputs = transitions();
        Told told = failingAt(1000, inputs);
        // the failed first batch, the one waiting behind it and the one decided meanwhile: one input at a time
        assertThat(told.callSizeOf(inputs.get(0))).isEqualTo(1);
        assertThat(told.callSizeOf(inputs.get(3999))).isEqualTo(1);
        assertThat(told.callSizeOf(inputs.get(5900))).isEqualTo(1);
        // then batches again
        assertThat(told.callSizeOf(inputs.get(6100))).isGreaterThan(1);
        assertThat(told.callSizeOf(inputs.get(8499))).isGreaterThan(1);
    }

    @Test
    void aCommitThatFailsBehindACommittedBatchLeavesThatBatchCommittedAndRedoesTheRest() throws Exception {
        List<Input> inputs = transitions();
        Told told = failingAt(3000, inputs);
        // the first batch was committed whole and acted on before the second failed
        assertThat(told.callSizeOf(inputs.get(0))).isGreaterThan(1);
        assertThat(told.callSizeOf(inputs.get(1900))).isGreaterThan(1);
        // the failed second batch, the one behind it and the one decided meanwhile: one input at a time
        assertThat(told.callSizeOf(inputs.get(2100))).isEqualTo(1);
        assertThat(told.callSizeOf(inputs.get(5000))).isEqualTo(1);
        assertThat(told.callSizeOf(inputs.get(7900))).isEqualTo(1);
        assertThat(told.callSizeOf(inputs.get(8499))).isGreaterThan(1);
    }

    /**
     * Runs {@code inputs} with the one at {@code badAt} replaced by a transition whose commit
     * fails, checks what every case must hold, and returns what the listener was told.
     */
    private Told failingAt(int badAt, List<Input> inputs) throws Exception {
        // past 2262-04-11, the last instant the store's nanosecond times can hold: its batch's commit fails
        Input bad = new Input.Transition(HealthTransition.of(Instant.parse("2263-01-01T00:00:00Z"), "fares-2", "n1",
                "heartbeat", SignalState.SILENT));
        inputs.set(badAt, bad);
        Told told = new Told();
        try (Store store = Store.openSqlite(dir.resolve("tend.db")); SimulatedExecutor sim = new SimulatedExecutor(1, 100);
             QuartzTimers quartz = new QuartzTimers()) {
            Checked checked = new Checked(store);
            Orchestrator orch = recovered(store, checked, sim, quartz, told);
            List<CompletableFuture<List<Effect>>> answered = new ArrayList<>();
            for (int i = 0; i < inputs.size(); i++) {
                Input in = inputs.get(i);
                if (i % 500 == 7) {
                    CompletableFuture<List<Effect>> f = orch.submitEventAndWait(in);
                    // completed on the driver thread once committed: the journal holds it by then
                    answered.add(f.thenApply(fx -> {
                        checked.journalHolds(told.position(in) + 1, "a caller answered");
                        return fx;
                    }));
                } else {
                    orch.submitEvent(in);
                }
            }
            orch.runUntil(orch::isIdle);

            assertThat(told.refused).containsExactly(bad);
            List<Input> expected = new ArrayList<>(inputs);
            expected.remove(bad);
            assertThat(told.transitionsIn(Set.copyOf(expected))).as("told in the order queued").isEqualTo(expected);
            assertThat(answered).allSatisfy(f -> assertThat(f).isCompleted());
            assertThat(checked.calls).as("executor calls checked").isPositive();
            assertThat(checked.arms).as("timers armed checked").isPositive();
            assertThat(told.violations).isEmpty();
            assertThat(checked.violations).isEmpty();
            assertThat(store.read(StoreReader::lastInputSeq)).isGreaterThanOrEqualTo(INPUTS - 1);
            List<String> kinds = new ArrayList<>();
            store.read(r -> {
                r.forEachLedger(LedgerFilter.all(), e -> kinds.add(e.kind()));
                return null;
            });
            assertThat(kinds).containsOnlyOnce("input-refused").contains("run-started");
            assertThat(store.read(StoreReader::verifyLedger).ok()).isTrue();
        }
        return told;
    }

    @Test
    void batchesCommittedWhileTheNextIsDecidedAreToldInOrderEachAfterItsCommit() throws Exception {
        List<Input> inputs = transitions();
        Told told = new Told();
        try (Store store = Store.openSqlite(dir.resolve("tend.db")); SimulatedExecutor sim = new SimulatedExecutor(1, 100);
             QuartzTimers quartz = new QuartzTimers()) {
            Checked checked = new Checked(store);
            Orchestrator orch = recovered(store, checked, sim, quartz, told);
            for (Input in : inputs) orch.submitEvent(in);
            orch.runUntil(orch::isIdle);

            assertThat(told.refused).isEmpty();
            assertThat(told.transitionsIn(Set.copyOf(inputs))).isEqualTo(inputs);
            assertThat(told.callSizeOf(inputs.get(0))).isEqualTo(BATCH);
            assertThat(checked.calls).isPositive();
            assertThat(told.violations).isEmpty();
            assertThat(checked.violations).isEmpty();
            assertThat(store.read(StoreReader::verifyLedger).ok()).isTrue();
        }
    }

    @Test
    void aSnapshotDueWhileBatchesAreInFlightIsTheStateAfterItsOwnBatchAndCutsNoBatchShort() throws Exception {
        List<Input> inputs = transitions();
        Told told = new Told();
        Path db = dir.resolve("tend.db");
        List<SnapshotRow> kept = new ArrayList<>();
        try (Store store = Store.openSqlite(db); SimulatedExecutor sim = new SimulatedExecutor(1, 100);
             QuartzTimers quartz = new QuartzTimers()) {
            Checked checked = new Checked(store);
            Orchestrator orch = recovered(store, checked, sim, quartz, told, SnapshotPolicy.every(3000));
            for (Input in : inputs) orch.submitEvent(in);
            orch.runUntil(orch::isIdle);

            // the batches were handed on while the ones before them were written, a snapshot due or not
            for (int first = 0; first + BATCH <= INPUTS; first += BATCH) assertThat(told.callSizeOf(inputs.get(first))).isEqualTo(BATCH);
            assertThat(told.violations).isEmpty();
            assertThat(checked.violations).isEmpty();
            try (java.sql.Connection c = java.sql.DriverManager.getConnection("jdbc:sqlite:" + db);
                 java.sql.ResultSet rs = c.createStatement().executeQuery("SELECT seq, taken_ns, format, setup, body FROM snapshots ORDER BY seq")) {
                while (rs.next()) {
                    kept.add(new SnapshotRow(rs.getLong(1), Instant.EPOCH.plusNanos(rs.getLong(2)), rs.getInt(3), rs.getString(4),
                            rs.getBytes(5)));
                }
            }
            // the one taken with batches in flight, after the second batch (4,000 inputs past 3,000), and the one
            // after the whole journal (the transitions, and the executors' results and timers' firings among them)
            assertThat(kept).extracting(SnapshotRow::seq).containsExactly(2L * BATCH, store.read(StoreReader::lastInputSeq));
            // each is the state of an engine that read the journal up to its seq, and no further
            Engine replayed = new Engine(setup());
            List<dev.tend.store.InputRow> journal = new ArrayList<>();
            store.read(r -> {
                r.forEachInput(0, journal::add);
                return null;
            });
            int next = 0;
            for (SnapshotRow snapshot : kept) {
                for (; next < journal.size() && journal.get(next).seq() <= snapshot.seq(); next++) {
                    replayed.handle(InputCodec.decode(journal.get(next)), journal.get(next).now());
                }
                assertThat(SnapshotCodec.json(SnapshotCodec.decode(snapshot).state())).as("the snapshot at %d", snapshot.seq())
                        .isEqualTo(SnapshotCodec.json(replayed.state()));
            }
        }
    }

    /** Silences and recoveries of heartbeats over 4 clusters of 3 nodes, a second apart. */
    private static List<Input> transitions() {
        List<Input> out = new ArrayList<>(INPUTS);
        for (int i = 0; i < INPUTS; i++) {
            SignalState state = (i / 12) % 2 == 0 ? SignalState.SILENT : SignalState.CLEAR;
            out.add(new Input.Transition(HealthTransition.of(AT.plusSeconds(i), "fares-" + (i % 4 + 1), "n" + (i / 4 % 3 + 1),
                    "heartbeat", state)));
        }
        return out;
    }

    /** What the listener was told, each call checked against the journal at that moment. */
    private static final class Told {
        final List<Input> refused = Collections.synchronizedList(new ArrayList<>());
        final List<String> violations = Collections.synchronizedList(new ArrayList<>());
        private final List<Input> inOrder = new ArrayList<>();
        private final Map<Input, Integer> callSize = new IdentityHashMap<>();
        private final Map<Input, Integer> position = new IdentityHashMap<>();
        private long inputsTold;

        CommitListener checkingAgainst(Store store) {
            return new CommitListener() {
                @Override
                public void committed(Engine engine, List<Input> batch, List<Effect> effects) {
                    inputsTold += batch.size();
                    long journaled = store.read(StoreReader::lastInputSeq);
                    if (journaled < inputsTold) violations.add("told of " + inputsTold + " inputs with " + journaled + " journaled");
                    for (Input in : batch) {
                        position.put(in, inOrder.size());
                        inOrder.add(in);
                        callSize.put(in, batch.size());
                    }
                }

                @Override
                public void refused(Input input, String reason) {
                    refused.add(input);
                }
            };
        }

        /** Where {@code in} is among the inputs told so far (journal rows count the same way: no source, nothing refused before it). */
        int position(Input in) {
            Integer p = position.get(in);
            return p == null ? Integer.MAX_VALUE : p;
        }

        List<Input> transitionsIn(Set<Input> of) {
            Set<Input> ids = Collections.newSetFromMap(new IdentityHashMap<>());
            ids.addAll(of);
            return inOrder.stream().filter(ids::contains).toList();
        }

        int callSizeOf(Input in) {
            return callSize.getOrDefault(in, 0);
        }
    }

    /** An executor and timers that check, when asked, that what asks is committed. */
    private static final class Checked {
        private final Store store;
        final List<String> violations = Collections.synchronizedList(new ArrayList<>());
        volatile int calls;
        volatile int arms;

        Checked(Store store) {
            this.store = store;
        }

        Executor executor(Executor inner) {
            return new Executor() {
                @Override
                public String kind() {
                    return inner.kind();
                }

                @Override
                public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
                    calls++;
                    List<StepRow> steps = store.read(r -> r.steps(call.runId()));
                    boolean committed = steps.stream().anyMatch(s -> s.stepId().equals(call.stepId()) && s.attempt() >= call.attempt());
                    if (!committed) violations.add("executor called for " + call.key() + " before its step was committed");
                    inner.execute(call, done);
                }

                @Override
                public boolean canAskAgain(Effect.CallExecutor call) {
                    return inner.canAskAgain(call);
                }
            };
        }

        Timers timers(Timers inner) {
            return new Timers() {
                @Override
                public void arm(String key, Instant due) {
                    arms++;
                    List<TimerRow> rows = store.read(StoreReader::timers);
                    if (rows.stream().noneMatch(t -> t.key().equals(key))) violations.add("timer " + key + " armed before its commit");
                    inner.arm(key, due);
                }

                @Override
                public void cancel(String key) {
                    inner.cancel(key);
                }
            };
        }

        void journalHolds(long rows, String what) {
            long journaled = store.read(StoreReader::lastInputSeq);
            if (journaled < rows) violations.add(what + " with " + journaled + " of " + rows + " inputs journaled");
        }
    }

    /** An orchestrator on {@code store} whose executor calls, timers and listener are checked against it, recovered and ready. */
    private Orchestrator recovered(Store store, Checked checked, SimulatedExecutor sim, QuartzTimers quartz, Told told) throws Exception {
        return recovered(store, checked, sim, quartz, told, Orchestrator.DEFAULT_SNAPSHOTS);
    }

    private Orchestrator recovered(Store store, Checked checked, SimulatedExecutor sim, QuartzTimers quartz, Told told,
                                   SnapshotPolicy snapshots) throws Exception {
        Orchestrator orch = new Orchestrator(store, setup(), Map.of("simulated", checked.executor(sim)), checked.timers(quartz),
                n -> { }, Clock.systemUTC(), told.checkingAgainst(store), snapshots);
        orch.limitBatches(BATCH);
        quartz.fireInto(k -> orch.submit(new Input.TimerFired(k)));
        orch.recover();
        return orch;
    }

    private EngineSetup setup() throws Exception {
        return FixHeartbeatFixture.setup(dir);
    }
}
