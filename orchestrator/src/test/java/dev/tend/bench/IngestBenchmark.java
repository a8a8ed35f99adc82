package dev.tend.bench;

import dev.tend.runtime.Orchestrator;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Durable ingest as users run it (not a test; see DEVELOPERS.md, "Ingest"): every
 * measurement is a fresh process. It writes a realistic mix ({@link IngestMix}: problems
 * confirmed, held by guards, masked, runs started and finished by the simulated executor) of
 * N transitions over a fleet of invented clusters, then times (a) the floor,
 * {@link IngestFloor}: a plain {@code java} with the JVM's defaults parsing each line with
 * Jackson and appending it to SQLite in batched transactions, and (b)
 * {@code bin/tend ingest FILE} on a new store with the bundled playbooks and the simulated
 * executor (start-up, journal, engine, ledger, commits, snapshots, and the wait for the runs
 * still executing at the end of the file). Prints wall and CPU time (user + system) of both,
 * the rates, the ratio floor/tend and what tend decided (runs, verdicts, ledger entries).
 * Target: tend at least 0.5 x the floor.
 *
 * <p>Arguments: N (default 1,000,000), clusters (2,000), inputs between snapshots (default: none
 * given, so tend's own default {@link Orchestrator#DEFAULT_SNAPSHOTS}, what users get; 0: none), and
 * optionally {@code --root DIR} (the repository: bin/tend, playbooks/library; default .),
 * {@code --rounds R} (default 3: the floor and tend back to back R times, the verdict the median
 * of the rounds' ratios), {@code --variants yes} (also tend, in the first round, with the JVM's defaults instead of the launcher's
 * options, with each of the compiler and collector options alone, and with both but the
 * default young generation), {@code --in-process yes} (instead: both in this
 * JVM, with the CPU of each of tend's threads, see {@link IngestInProcess}).
 */
public final class IngestBenchmark {
    /** The launcher with its own options: the row the ratio is taken from, in every round. */
    private static final String AS_USERS_RUN_IT = "bin/tend ingest";

    private IngestBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        List<String> positional = positional(args);
        int n = positional.size() > 0 ? Integer.parseInt(positional.get(0)) : 1_000_000;
        int clusters = positional.size() > 1 ? Integer.parseInt(positional.get(1)) : 2000;
        // the snapshot interval only when given: otherwise tend's default, as users run it
        Integer snapshotEvery = positional.size() > 2 ? Integer.valueOf(positional.get(2)) : null;
        dev.tend.runtime.SnapshotPolicy snapshots = snapshotEvery == null ? Orchestrator.DEFAULT_SNAPSHOTS
                : dev.tend.runtime.SnapshotPolicy.every(snapshotEvery);
        Path root = Path.of(LiveBenchmark.arg(args, "--root", ".")).toAbsolutePath().normalize();
        if (!Files.isDirectory(root.resolve("playbooks/library")) && Files.isDirectory(root.resolve("../playbooks/library"))) {
            root = root.getParent(); // run from the orchestrator module
        }
        Path dir = Files.createTempDirectory("tend-bench");
        Path fleetFile = dir.resolve("fleet.yaml");
        Path events = dir.resolve("events.jsonl");
        IngestMix.writeFleet(fleetFile, clusters);
        IngestMix.writeEvents(events, n, clusters);
        // on disk before anything is timed: neither timed process shares the machine with the operating system
        // writing the new 100 MB out
        for (Path f : List.of(fleetFile, events)) {
            try (java.nio.channels.FileChannel c = java.nio.channels.FileChannel.open(f, java.nio.file.StandardOpenOption.WRITE)) {
                c.force(true);
            }
        }
        System.out.printf(Locale.ROOT, "ingest benchmark: %,d transitions over %,d clusters (%,d bytes), snapshots %s,"
                + " in %s; %s%n", n, clusters, Files.size(events), snapshots, dir, ChildProcess.load());
        if ("yes".equals(LiveBenchmark.arg(args, "--in-process", "no"))) {
            System.setProperty("tend.library", root.resolve("playbooks/library").toString());
            IngestInProcess.run(events, fleetFile, dir, n, snapshots);
            decided(dir.resolve("tend.db"), n);
            System.out.printf("after: %s%n", ChildProcess.load());
            return;
        }
        String tendCommand = root.resolve("bin/tend").toString();
        ColdReplayBenchmark.run(dir, "version", List.of(tendCommand, "--version"), 0); // the launcher's jar and archive, once
        List<String> floorCommand = List.of(ChildProcess.java(), "-cp", BenchClasspath.ofThisProcess(), IngestFloor.class.getName(),
                events.toString(), dir.resolve("floor.db").toString());
        Map<String, Map<String, String>> variants = new LinkedHashMap<>();
        variants.put(AS_USERS_RUN_IT, Map.of());
        if ("yes".equals(LiveBenchmark.arg(args, "--variants", "no"))) {
            variants.put("  JVM defaults (C2, G1)", Map.of("TEND_INGEST_OPTS", ""));
            variants.put("  C1 only", Map.of("TEND_INGEST_OPTS", "-XX:TieredStopAtLevel=1"));
            variants.put("  serial collector only", Map.of("TEND_INGEST_OPTS", "-XX:+UseSerialGC"));
            variants.put("  C1, serial, default young generation", Map.of("TEND_INGEST_OPTS", "-XX:TieredStopAtLevel=1 -XX:+UseSerialGC"));
        }
        // Rounds of the floor and tend back to back: this machine's speed moves by a quarter within minutes, and a
        // pair measured together shares its phase; the verdict is the median of the rounds' ratios.
        int rounds = Integer.parseInt(LiveBenchmark.arg(args, "--rounds", "3"));
        List<Double> ratios = new ArrayList<>();
        System.out.printf(Locale.ROOT, "%-48s %9s %9s %12s %12s %12s%n", "", "wall s", "CPU s", "events/s", "ratio (wall)", "ratio (CPU)");
        int db = 0;
        for (int round = 1; round <= rounds; round++) {
            for (String end : List.of("", "-wal", "-shm", "-journal")) Files.deleteIfExists(Path.of(dir.resolve("floor.db") + end));
            ColdReplayBenchmark.Timing floor = ColdReplayBenchmark.run(dir, "floor", floorCommand, 0);
            row("floor (java, Jackson + SQLite batches)" + (rounds > 1 ? ", round " + round : ""), floor, floor, n);
            for (var v : (round == 1 ? variants : Map.of(AS_USERS_RUN_IT, Map.<String, String>of())).entrySet()) {
                Path store = dir.resolve("tend-" + db++ + ".db");
                List<String> command = new ArrayList<>(List.of(tendCommand, "ingest", events.toString(), "--db", store.toString(),
                        "--playbooks", root.resolve("playbooks/library").toString(), "--fleet", fleetFile.toString(),
                        "--speedup", "1000000"));
                if (snapshotEvery != null) command.addAll(List.of("--snapshot-every", snapshotEvery.toString()));
                ColdReplayBenchmark.Timing t = ColdReplayBenchmark.run(dir, "tend-" + db, command, -1, v.getValue());
                row(v.getKey(), t, floor, n);
                if (v.getKey().equals(AS_USERS_RUN_IT)) ratios.add(floor.wall() / t.wall());
                if (db == 1) decided(store, n);
                for (String end : List.of("", "-wal", "-shm")) Files.deleteIfExists(Path.of(store + end)); // 236 MB a round
            }
        }
        double median = median(ratios);
        System.out.printf(Locale.ROOT, "ratio  tend/floor = %.2f by wall clock, the median of %d rounds %s (target >= 0.50): %s%n",
                median, ratios.size(), ratios.stream().map(r -> String.format(Locale.ROOT, "%.2f", r)).toList(), median >= 0.5 ? "met" : "NOT met");
        System.out.printf("after: %s%n", ChildProcess.load());
    }

    private static void row(String what, ColdReplayBenchmark.Timing t, ColdReplayBenchmark.Timing floor, int n) {
        System.out.printf(Locale.ROOT, "%-48s %9.2f %9.2f %,12.0f %12.2f %12.2f%n", what, t.wall(), t.cpu(), n / t.wall(),
                floor.wall() / t.wall(), floor.cpu() / t.cpu());
    }

    static double median(List<Double> values) {
        List<Double> sorted = values.stream().sorted().toList();
        int m = sorted.size() / 2;
        return sorted.size() % 2 == 1 ? sorted.get(m) : (sorted.get(m - 1) + sorted.get(m)) / 2;
    }

    /** The arguments that are neither an option ({@code --name}) nor an option's value. */
    private static List<String> positional(String[] args) {
        List<String> out = new ArrayList<>();
        for (int i = 0; i < args.length; i++) {
            if (args[i].startsWith("--")) i++;
            else out.add(args[i]);
        }
        return out;
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
            System.out.printf(Locale.ROOT, "decided: %,d runs started, %,d decisions (%s; %.2f %% of the transitions), %,d ledger entries%n",
                    started, verdicts, byVerdict, 100.0 * verdicts / n, entries);
        }
    }
}
