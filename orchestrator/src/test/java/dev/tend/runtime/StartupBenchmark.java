package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EngineState;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.time.Timers;
import dev.tend.store.InputRow;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;

/**
 * Start-up with and without a snapshot, in one run on one machine: journals N transitions
 * over the bundled Larkspur fleet (invented) straight into a SQLite store, then measures
 * (a) a start that replays the whole journal, (b) a start from a snapshot taken after all
 * but the last 1 % of them (loads it, replays the rest), and (c) reading and loading the
 * snapshot alone, the floor of (b). Prints seconds and the ratios a/c and b/c. Not a unit
 * test: {@code mvn -B -Pbench -DskipTests -pl orchestrator -am verify} runs it (see DEVELOPERS.md).
 *
 * <p>Arguments: N (default 1,000,000), the library folder (default playbooks/library).
 */
public final class StartupBenchmark {
    private static final Timers NO_TIMERS = new Timers() {
        @Override
        public void arm(String key, Instant due) {
        }

        @Override
        public void cancel(String key) {
        }
    };

    public static void main(String[] args) throws Exception {
        long n = args.length > 0 ? Long.parseLong(args[0]) : 1_000_000;
        Path library = Path.of(args.length > 1 ? args[1] : "playbooks/library");
        PlaybookSet set = PlaybookLoader.load(library);
        Fleet fleet = FleetFile.load(library.resolve("fleet.yaml"));
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        Path dir = Files.createTempDirectory("tend-startup-bench");
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            long tail = Math.max(1, n / 100);
            Journal journal = new Journal(fleet);
            long t0 = System.nanoTime();
            journal.append(store, n - tail);
            System.out.printf("startup benchmark: %,d journaled transitions over %,d clusters, written in %.1f s (%s)%n",
                    n, fleet.size(), seconds(t0), dir);

            Orchestrator fullStart = orchestrator(store, setup);
            fullStart.loadState();
            EngineState state = fullStart.engine().state();
            SnapshotRow row = SnapshotCodec.encode(n - tail, Instant.now(), SnapshotCodec.fingerprint(setup), state, Map.of());
            store.useTransaction(tx -> tx.putSnapshot(row, 2));
            journal.append(store, tail);
            System.out.printf("snapshot: %,d bytes compressed, after input %,d%n", row.body().length, n - tail);

            double full = measure(() -> {
                store.useTransaction(tx -> tx.putSnapshot(new SnapshotRow(row.seq(), row.takenAt(), row.format(), "another setup",
                        row.body()), 2));
                orchestrator(store, setup).loadState();
            });
            store.useTransaction(tx -> tx.putSnapshot(row, 2));
            double withSnapshot = measure(() -> orchestrator(store, setup).loadState());
            double floor = measure(() -> {
                SnapshotRow r = store.read(StoreReader::latestSnapshot).orElseThrow();
                Engine.restore(setup, SnapshotCodec.decode(r).state());
            });
            System.out.printf("(a) start replaying the whole journal:       %7.2f s  (%.1f x the floor)%n", full, full / floor);
            System.out.printf("(b) start from the snapshot + last %,d: %7.2f s  (%.1f x the floor; target under 15 s)%n", tail,
                    withSnapshot, withSnapshot / floor);
            System.out.printf("(c) floor: read and load the snapshot alone: %7.2f s%n", floor);
        }
    }

    private static Orchestrator orchestrator(Store store, EngineSetup setup) {
        return new Orchestrator(store, setup, Map.of(), NO_TIMERS, call -> { }, Clock.systemUTC(), CommitListener.NONE, 0);
    }

    private static double measure(Runnable r) {
        long t0 = System.nanoTime();
        r.run();
        return seconds(t0);
    }

    private static double seconds(long t0) {
        return (System.nanoTime() - t0) / 1e9;
    }

    /** Random transitions over the fleet, in event-time order, appended in batches. */
    private static final class Journal {
        private static final String[] SIGNALS = {"heartbeat", "process-down", "replica-lag", "cert-expiry", "storage-full"};
        private final List<ClusterSpec> clusters;
        private final Random random = new Random(7);
        private Instant at = Instant.parse("2027-03-14T00:00:00Z");

        Journal(Fleet fleet) {
            this.clusters = new ArrayList<>(fleet.clusters());
        }

        void append(Store store, long count) {
            List<InputRow> batch = new ArrayList<>(10_000);
            for (long i = 0; i < count; i++) {
                at = at.plus(Duration.ofMillis(200));
                ClusterSpec c = clusters.get(random.nextInt(clusters.size()));
                String signal = SIGNALS[random.nextInt(SIGNALS.length)];
                SignalState state = random.nextInt(3) == 0 ? (signal.equals("heartbeat") ? SignalState.SILENT : SignalState.BREACH)
                        : SignalState.CLEAR;
                HealthTransition t = HealthTransition.of(at, c.id().value(), c.nodes().get(random.nextInt(c.nodes().size())).id().value(),
                        signal, state);
                batch.add(InputCodec.encode(Input.Transition.withWire(t), at));
                if (batch.size() == 10_000) {
                    List<InputRow> rows = List.copyOf(batch);
                    store.useTransaction(tx -> tx.appendInputs(rows));
                    batch.clear();
                }
            }
            if (!batch.isEmpty()) store.useTransaction(tx -> tx.appendInputs(batch));
        }
    }
}
