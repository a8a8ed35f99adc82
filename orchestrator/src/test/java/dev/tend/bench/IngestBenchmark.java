package dev.tend.bench;

import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.executor.Executor;
import dev.tend.executor.SimulatedExecutor;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.QuartzTimers;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.WireReader;
import dev.tend.store.Store;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.Statement;
import java.time.Clock;
import java.time.Instant;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * Measures, in one run on one machine: (a) the floor, parsing N transitions with Jackson and
 * appending N rows to SQLite in batched transactions, and (b) tend's durable ingest, verdict
 * and ledger path on the same N: the bundled playbooks deciding on a realistic mix
 * ({@link IngestMix}: problems confirmed, held by guards, masked, runs started and finished
 * by the simulated executor). Prints both rates, the ratio b/a and what tend decided (runs,
 * verdicts, ledger entries). Not a unit test: run it with
 * {@code mvn -B -q -Pbench -pl orchestrator -am verify} (see DEVELOPERS.md).
 *
 * <p>Arguments: N (default 1,000,000), clusters (default 2,000), inputs between snapshots
 * (default {@link Orchestrator#DEFAULT_SNAPSHOT_EVERY}, as {@code tend ingest}; 0: none).
 */
public final class IngestBenchmark {
    public static void main(String[] args) throws Exception {
        int n = args.length > 0 ? Integer.parseInt(args[0]) : 1_000_000;
        int clusters = args.length > 1 ? Integer.parseInt(args[1]) : 2000;
        int snapshotEvery = args.length > 2 ? Integer.parseInt(args[2]) : Orchestrator.DEFAULT_SNAPSHOT_EVERY;
        Path dir = Files.createTempDirectory("tend-bench");
        Path fleetFile = dir.resolve("fleet.yaml");
        Path events = dir.resolve("events.jsonl");
        IngestMix.writeFleet(fleetFile, clusters);
        IngestMix.writeEvents(events, n, clusters);
        System.out.printf("benchmark: %,d transitions over %,d clusters (%,d bytes), a snapshot every %,d inputs, in %s; %s%n", n,
                clusters, Files.size(events), snapshotEvery, dir, ChildProcess.load());

        long c0 = ChildProcess.ownCpuNanos();
        double floor = rate(n, floor(events, dir.resolve("floor.db")));
        long c1 = ChildProcess.ownCpuNanos();
        System.out.printf("floor  (Jackson parse + batched SQLite insert): %,.0f events/s, %.2f s CPU%n", floor, (c1 - c0) / 1e9);
        long[] cpu = new long[1];
        Map<String, Long> threadsBefore = ThreadCpu.byName();
        double tend = rate(n, tend(events, fleetFile, dir.resolve("tend.db"), snapshotEvery, cpu));
        System.out.printf("         CPU by thread: %s%n", ThreadCpu.since(threadsBefore));
        System.out.printf("tend   (journal + engine + ledger, durable):   %,.0f events/s, %.2f s CPU%n", tend, cpu[0] / 1e9);
        System.out.printf("ratio  tend/floor = %.2f by wall clock (target >= 0.50), %.2f by CPU time%n", tend / floor,
                (double) (c1 - c0) / cpu[0]);
        decided(dir.resolve("tend.db"), n);
        System.out.printf("after: %s%n", ChildProcess.load());
    }

    private static double rate(int n, long nanos) {
        return n / (nanos / 1e9);
    }

    static long floor(Path events, Path db) throws Exception {
        ObjectMapper json = new ObjectMapper();
        long t0 = System.nanoTime();
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db)) {
            try (Statement s = c.createStatement()) {
                s.execute("PRAGMA journal_mode=WAL");
                s.execute("PRAGMA synchronous=NORMAL");
                s.execute("CREATE TABLE events (seq INTEGER PRIMARY KEY, at TEXT, cluster TEXT, payload TEXT)");
            }
            c.setAutoCommit(false);
            try (BufferedReader in = Files.newBufferedReader(events, StandardCharsets.UTF_8);
                 PreparedStatement ps = c.prepareStatement("INSERT INTO events (at, cluster, payload) VALUES (?, ?, ?)")) {
                String line;
                int batch = 0;
                while ((line = in.readLine()) != null) {
                    var node = json.readTree(line);
                    ps.setString(1, node.get("at").asText());
                    ps.setString(2, node.get("cluster").asText());
                    ps.setString(3, line);
                    ps.addBatch();
                    if (++batch == 2000) {
                        ps.executeBatch();
                        c.commit();
                        batch = 0;
                    }
                }
                ps.executeBatch();
                c.commit();
            }
        }
        return System.nanoTime() - t0;
    }

    /** Returns the wall time until every event is committed; {@code cpu[0]}: this process's CPU time meanwhile. */
    static long tend(Path events, Path fleetFile, Path db, int snapshotEvery, long[] cpu) throws Exception {
        Path library = Path.of(System.getProperty("tend.library", "playbooks/library"));
        if (!Files.isDirectory(library)) library = Path.of("..").resolve(library);
        PlaybookSet set = PlaybookLoader.load(library);
        Fleet fleet = FleetFile.load(fleetFile);
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        Clock clock = Clock.systemUTC();
        long t0 = System.nanoTime();
        long c0 = ChildProcess.ownCpuNanos();
        try (Store store = Store.openSqlite(db); Executor sim = new SimulatedExecutor(1, 1_000_000)) {
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, x -> { }, clock,
                    dev.tend.runtime.CommitListener.NONE, snapshotEvery);
            timers.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            AtomicBoolean eof = new AtomicBoolean();
            long[] readerCpu = new long[1];
            Thread reader = new Thread(() -> {
                try (BufferedReader in = Files.newBufferedReader(events, StandardCharsets.UTF_8)) {
                    WireReader.of(events.toString()).readAll(in, r -> {
                        if (r instanceof LineResult.Event e) {
                            try {
                                orch.submitEvent(Input.Transition.withWire((HealthTransition) e.event()));
                            } catch (InterruptedException ie) {
                                throw new IllegalStateException(ie);
                            }
                        }
                    });
                } catch (Exception e) {
                    throw new IllegalStateException(e);
                } finally {
                    readerCpu[0] = java.lang.management.ManagementFactory.getThreadMXBean().getCurrentThreadCpuTime();
                    eof.set(true);
                }
            });
            reader.start();
            // timed until every event is committed; runs still going then may finish for 5 s more, untimed
            orch.runUntil(eof::get);
            long took = System.nanoTime() - t0;
            cpu[0] = ChildProcess.ownCpuNanos() - c0;
            long until = System.nanoTime() + 5_000_000_000L;
            orch.runUntil(() -> orch.isIdle() || System.nanoTime() > until);
            timers.close();
            System.out.printf("         reader thread (wire reader): %.2f s CPU%n", readerCpu[0] / 1e9);
            System.out.printf("         runs: %d (%d still running after 5 s more)%n", orch.engine().runs().size(), orch.engine().activeRuns());
            return took;
        }
    }

    /** What tend decided, from the store: runs started, verdicts by kind, ledger entries. */
    static void decided(Path db, int n) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement()) {
            long entries = 0, verdicts = 0, started = 0;
            StringBuilder byVerdict = new StringBuilder();
            try (var rs = s.executeQuery("SELECT kind, count(*) FROM ledger GROUP BY kind")) {
                while (rs.next()) {
                    entries += rs.getLong(2);
                    if (rs.getString(1).equals("verdict")) verdicts = rs.getLong(2);
                    if (rs.getString(1).equals("run-started")) started = rs.getLong(2);
                }
            }
            try (var rs = s.executeQuery("SELECT json_extract(entry, '$.verdict') AS v, count(*) FROM ledger WHERE kind = 'verdict'"
                    + " GROUP BY v ORDER BY v")) {
                while (rs.next()) byVerdict.append(byVerdict.length() == 0 ? "" : ", ").append(rs.getString(1)).append(' ').append(rs.getLong(2));
            }
            System.out.printf("decided: %,d runs started, %,d decisions (%s; %.2f %% of the transitions), %,d ledger entries%n",
                    started, verdicts, byVerdict, 100.0 * verdicts / n, entries);
        }
    }
}
