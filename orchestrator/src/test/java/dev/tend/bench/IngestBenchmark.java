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
import dev.tend.runtime.ScheduledTimers;
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
 * and ledger path on the same N. Prints both rates and the ratio b/a. Not a unit test: run it
 * with {@code mvn -B -q -Pbench -pl orchestrator -am verify} (see DEVELOPERS.md).
 *
 * <p>Arguments: N (default 1,000,000), clusters (default 2,000).
 */
public final class IngestBenchmark {
    public static void main(String[] args) throws Exception {
        int n = args.length > 0 ? Integer.parseInt(args[0]) : 1_000_000;
        int clusters = args.length > 1 ? Integer.parseInt(args[1]) : 2000;
        Path dir = Files.createTempDirectory("tend-bench");
        Path fleetFile = dir.resolve("fleet.yaml");
        Path events = dir.resolve("events.jsonl");
        writeFleet(fleetFile, clusters);
        writeEvents(events, n, clusters);
        System.out.printf("benchmark: %,d transitions over %,d clusters (%,d bytes) in %s%n", n, clusters, Files.size(events), dir);

        double floor = rate(n, floor(events, dir.resolve("floor.db")));
        System.out.printf("floor  (Jackson parse + batched SQLite insert): %,.0f events/s%n", floor);
        double tend = rate(n, tend(events, fleetFile, dir.resolve("tend.db")));
        System.out.printf("tend   (journal + engine + ledger, durable):   %,.0f events/s%n", tend);
        System.out.printf("ratio  tend/floor = %.2f (target >= 0.50)%n", tend / floor);
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

    static long tend(Path events, Path fleetFile, Path db) throws Exception {
        Path library = Path.of(System.getProperty("tend.library", "playbooks/library"));
        if (!Files.isDirectory(library)) library = Path.of("..").resolve(library);
        PlaybookSet set = PlaybookLoader.load(library);
        Fleet fleet = FleetFile.load(fleetFile);
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        Clock clock = Clock.systemUTC();
        long t0 = System.nanoTime();
        try (Store store = Store.openSqlite(db); Executor sim = new SimulatedExecutor(1, 1_000_000)) {
            Orchestrator[] holder = new Orchestrator[1];
            ScheduledTimers timers = new ScheduledTimers(clock, k -> holder[0].submit(new Input.TimerFired(k)));
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, x -> { }, clock);
            holder[0] = orch;
            AtomicBoolean eof = new AtomicBoolean();
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
                    eof.set(true);
                }
            });
            reader.start();
            orch.runUntil(() -> eof.get() && orch.isIdle());
            timers.close();
            System.out.printf("         runs: %d, ledger entries: %d%n", orch.engine().runs().size(),
                    store.read(r -> r.ledgerHead().map(h -> h.seq()).orElse(0L)));
        }
        return System.nanoTime() - t0;
    }

    static void writeFleet(Path file, int clusters) throws Exception {
        try (BufferedWriter w = Files.newBufferedWriter(file)) {
            w.write("# invented benchmark fleet\nfleet: larkspur-bench\nclusters:\n");
            String[] tiers = {"standard", "bulk", "standard", "critical"};
            for (int c = 1; c <= clusters; c++) {
                w.write("  - id: bench-" + c + "\n    tags: { tier: " + tiers[c % 4] + " }\n    replication: { factor: 3, min-healthy: 2 }\n    nodes:\n");
                for (int n = 1; n <= 4; n++) w.write("      - { id: n" + n + ", zone: z-" + (char) ('a' + (n + c) % 3) + " }\n");
            }
        }
    }

    /** Background noise: short breaches that clear, repeats, a few real silent nodes. Invented. */
    static void writeEvents(Path file, int n, int clusters) throws Exception {
        SplittableRandom random = new SplittableRandom(7);
        String[] noise = {"disk-latency", "gc-pause", "request-errors", "replica-lag", "cert-expiry"};
        Instant t = Instant.parse("2027-03-14T00:00:00Z");
        try (BufferedWriter w = Files.newBufferedWriter(file)) {
            for (int i = 0; i < n; i++) {
                t = t.plusMillis(600);
                int c = 1 + random.nextInt(clusters);
                int node = 1 + random.nextInt(4);
                String signal;
                String state;
                if (random.nextInt(2000) == 0) {
                    signal = "heartbeat";
                    state = "silent";
                } else {
                    signal = noise[random.nextInt(noise.length)];
                    state = random.nextInt(3) == 0 ? "breach" : "clear";
                }
                w.write("{\"at\":\"" + t + "\",\"cluster\":\"bench-" + c + "\",\"node\":\"n" + node + "\",\"signal\":\"" + signal
                        + "\",\"state\":\"" + state + "\"}\n");
            }
        }
    }
}
