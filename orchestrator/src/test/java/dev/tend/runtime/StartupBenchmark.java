package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.InputRow;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Random;

/**
 * Start-up with and without a snapshot, in one run on one machine: a SQLite store journaling N
 * transitions over the bundled Larkspur fleet (invented), with a snapshot taken after all but
 * the last 1 % of them; then it measures (a) a start that replays the whole journal (the
 * snapshot set aside, as for a snapshot taken under another setup), (b) a start from the
 * snapshot and the last 1 %, and (c) reading and loading the snapshot alone, the floor of (b).
 * Each start is what {@code Orchestrator.recover()} does first ({@link JournalTail#open} and
 * {@link JournalTail#catchUp}). Prints seconds and the ratios a/c and b/c; target: (b) under
 * 15 s on 2 cores at N = 10,000,000. Not a unit test: {@code mvn -B -Pbench -DskipTests -pl
 * orchestrator -am verify} runs it (see DEVELOPERS.md).
 *
 * <p>Writing 10,000,000 inputs and the snapshot (a replay of them all) takes minutes, so the
 * store is kept in a cache folder under a name carrying N and {@link #JOURNAL_FORMAT} (raise it
 * when what {@link Journal} writes, or the journal's row format, changes). The snapshot in it is
 * taken again when it was taken under another setup or snapshot format.
 *
 * <p>Arguments: N (default 1,000,000), the library folder (default playbooks/library), the cache
 * folder (default: a new temporary folder, nothing kept).
 */
public final class StartupBenchmark {
    /** The layout of the journal {@link Journal} writes; part of the cached file's name. */
    static final int JOURNAL_FORMAT = 1;

    private StartupBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        long n = args.length > 0 ? Long.parseLong(args[0]) : 1_000_000;
        Path library = Path.of(args.length > 1 ? args[1] : "playbooks/library");
        Path cache = args.length > 2 ? Path.of(args[2]) : Files.createTempDirectory("tend-startup-bench");
        PlaybookSet set = PlaybookLoader.load(library);
        Fleet fleet = FleetFile.load(library.resolve("fleet.yaml"));
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        String fingerprint = SnapshotCodec.fingerprint(setup);
        long tail = Math.max(1, n / 100);
        System.out.printf(Locale.ROOT, "startup benchmark: %,d journaled transitions over %,d clusters; %s%n", n, fleet.size(),
                load());
        Path db = journal(cache, n, tail, fleet);
        try (Store store = Store.openSqlite(db)) {
            SnapshotRow row = snapshot(store, setup, fingerprint, n - tail);
            System.out.printf(Locale.ROOT, "snapshot: %,d bytes compressed, after input %,d%n", row.body().length, row.seq());

            double[] full = measure(() -> JournalTail.open(store, setup, "another setup").catchUp());
            double[] withSnapshot = measure(() -> JournalTail.open(store, setup, fingerprint).catchUp());
            double[] floor = measure(() -> {
                SnapshotRow r = store.read(StoreReader::latestSnapshot).orElseThrow();
                return Engine.restore(setup, SnapshotCodec.decode(r).state());
            });
            System.out.printf(Locale.ROOT, "(a) start replaying the whole journal:        %8.2f s (CPU %7.2f s)  %6.1f x the floor%n",
                    full[0], full[1], full[0] / floor[0]);
            System.out.printf(Locale.ROOT, "(b) start from the snapshot + last %,9d: %8.2f s (CPU %7.2f s)  %6.1f x the floor; "
                    + "target under 15 s: %s%n", tail, withSnapshot[0], withSnapshot[1], withSnapshot[0] / floor[0],
                    withSnapshot[0] < 15 ? "met" : "NOT met");
            System.out.printf(Locale.ROOT, "(c) floor: read and load the snapshot alone:  %8.2f s (CPU %7.2f s)%n", floor[0], floor[1]);
            System.out.printf("after: %s%n", load());
        }
    }

    /** The cached store of {@code n} journaled inputs, written first when it is missing. */
    private static Path journal(Path cache, long n, long tail, Fleet fleet) throws IOException {
        Files.createDirectories(cache);
        Path file = cache.resolve(String.format(Locale.ROOT, "journal-%d-format%d.db", n, JOURNAL_FORMAT));
        if (Files.exists(file)) {
            System.out.printf("journal: %s (cached; delete it to write it again)%n", file);
            return file;
        }
        Path building = cache.resolve(file.getFileName() + ".building");
        Files.deleteIfExists(building);
        long t0 = System.nanoTime();
        try (Store store = Store.openSqlite(building)) {
            new Journal(fleet).append(store, n);
        }
        Files.move(building, file, StandardCopyOption.ATOMIC_MOVE);
        System.out.printf(Locale.ROOT, "journal: %,d inputs written in %.0f s: %s (%,d MB)%n", n, seconds(System.nanoTime() - t0),
                file, Files.size(file) >> 20);
        return file;
    }

    /**
     * The store's snapshot after input {@code at}; taken (by replaying the journal up to it)
     * when the store has none under this setup and snapshot format.
     */
    private static SnapshotRow snapshot(Store store, EngineSetup setup, String fingerprint, long at) {
        Optional<SnapshotRow> kept = store.read(StoreReader::latestSnapshot);
        if (kept.isPresent() && kept.get().seq() == at && kept.get().setup().equals(fingerprint)
                && kept.get().format() == SnapshotCodec.FORMAT) {
            return kept.get();
        }
        long t0 = System.nanoTime();
        Engine engine = new Engine(setup);
        store.read(r -> {
            r.forEachInput(0, row -> {
                if (row.seq() <= at) engine.handle(InputCodec.decode(row), row.now());
            });
            return null;
        });
        SnapshotRow row = SnapshotCodec.encode(at, Instant.now(), fingerprint, engine.state(), Map.of());
        store.useTransaction(tx -> tx.putSnapshot(row, 2));
        System.out.printf(Locale.ROOT, "snapshot taken in %.0f s (a replay of %,d inputs)%n", seconds(System.nanoTime() - t0), at);
        return row;
    }

    /** Something measured; returns anything, so that the work is not optimised away. */
    private interface Work {
        Object run() throws Exception;
    }

    /** Wall and CPU seconds of one run of {@code w} (CPU: this whole process). */
    private static double[] measure(Work w) throws Exception {
        long c0 = cpuNanos();
        long t0 = System.nanoTime();
        w.run();
        return new double[]{seconds(System.nanoTime() - t0), seconds(cpuNanos() - c0)};
    }

    private static long cpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) java.lang.management.ManagementFactory.getOperatingSystemMXBean())
                .getProcessCpuTime();
    }

    private static double seconds(long nanos) {
        return nanos / 1e9;
    }

    private static String load() {
        try {
            String[] f = Files.readString(Path.of("/proc/loadavg")).trim().split("\\s+");
            return "load average: " + f[0] + ", " + f[1] + ", " + f[2];
        } catch (IOException e) {
            return "load average: unknown";
        }
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
            long report = Math.max(1, count / 10);
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
                if ((i + 1) % report == 0) System.out.printf(Locale.ROOT, "  %,d inputs journaled%n", i + 1);
            }
            if (!batch.isEmpty()) store.useTransaction(tx -> tx.appendInputs(batch));
        }
    }
}
