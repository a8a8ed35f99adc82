package dev.tend.bench;

import dev.tend.api.ApiServer;
import dev.tend.api.Gateway;
import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.auth.Tokens;
import dev.tend.api.view.FleetHealth;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.handover.HandoverReport;
import dev.tend.handover.ReportPeriod;
import dev.tend.metrics.TendMetrics;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;

import java.io.PrintWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * What operators ask of a large ledger (not a test; see DEVELOPERS.md, "Benchmarks"): builds or
 * reuses a SQLite store of N ledger entries ({@link LargeLedger}, cached), then measures, each
 * against a floor taken in the same run:
 * <ul>
 *   <li>the handover of the last night (about 100,000 entries) computed in this JVM
 *       ({@link HandoverReport#from}), against the plain JDBC read of the night's rows;</li>
 *   <li>{@code bin/tend handover} of that night as a fresh process, against a fresh {@code java}
 *       process reading the same rows ({@link LedgerRowsFloor});</li>
 *   <li>{@code GET /api/v1/ledger} with filters and {@code GET /api/v1/handover} over HTTP on
 *       loopback (the real API server on the store), against the same SELECT with plain JDBC.</li>
 * </ul>
 * Targets: the handover under 500 ms, a ledger page under 200 ms. Figures are medians of 5
 * rounds after one round of warm-up (the fresh processes: 3 rounds).
 *
 * <p>Arguments: {@code --entries N} (10,000,000), {@code --cache DIR} (where the store is kept,
 * default orchestrator/target/bench-cache), {@code --root DIR} (the repository: bin/tend,
 * playbooks/library), {@code --cli no} (leave out the fresh processes).
 */
public final class LedgerScaleBenchmark {
    private static final int ROUNDS = 5;
    private static final String TOKEN = "ledger-scale-benchmark-viewer-token-0001";

    private LedgerScaleBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        Path root = Path.of(LiveBenchmark.arg(args, "--root", ".")).toAbsolutePath().normalize();
        long entries = Long.parseLong(LiveBenchmark.arg(args, "--entries", "10000000"));
        Path cache = Path.of(LiveBenchmark.arg(args, "--cache", root.resolve("orchestrator/target/bench-cache").toString()));
        System.out.printf(Locale.ROOT, "ledger scale benchmark: %,d entries; %s%n", entries, ChildProcess.load());
        Path db = LargeLedger.cached(cache, entries);
        Instant until = LargeLedger.lastNightEnd(entries);
        ReportPeriod night = ReportPeriod.of(until.minus(Duration.ofHours(8)), until);
        List<String[]> rows = new ArrayList<>();
        try (Store store = Store.openSqlite(db); Connection jdbc = DriverManager.getConnection("jdbc:sqlite:" + db)) {
            long[] size = LedgerRowsFloor.period(jdbc, night.since(), night.until());
            System.out.printf(Locale.ROOT, "night %s to %s: %,d entries (%,d MB of entry text)%n", night.since(), night.until(),
                    size[0], size[1] >> 20);
            Measure floor = median(() -> LedgerRowsFloor.period(jdbc, night.since(), night.until()));
            HandoverReport[] last = new HandoverReport[1];
            Measure tend = median(() -> last[0] = store.read(r -> HandoverReport.from(r, night)));
            System.out.printf(Locale.ROOT, "  the report: %s; ledger %s%n", last[0].totals(), last[0].ledger().verifyMessage());
            rows.add(row("handover of the night, in this JVM", floor, tend, 500));
            // the two things the handover does in one walk, each done alone for comparison
            long from = store.read(r -> r.firstLedgerSeqAt(night.since()));
            rows.add(row("  apart: reading the night's entries alone", floor, median(() -> store.read(r -> {
                long[] n = {0};
                r.forEachLedgerOfPeriod(new dev.tend.store.LedgerPeriodQuery(night.since(), night.until(), Set.of(),
                        Set.of("run-started"), Set.of("run-ended")), e -> n[0]++);
                return n[0];
            })), 500));
            rows.add(row("  apart: verifying alone from entry " + from, floor, median(() -> store.read(r -> r.verifyLedgerFrom(from))), 500));

            ApiServer api = ApiServer.start("127.0.0.1", 0, new ApiServer.Parts(store, readOnly(), Tokens.of(List.of(
                    new Tokens.Entry(new Caller("bench-viewer", Set.of(Role.VIEWER)), Tokens.hash(TOKEN)))), FleetHealth::empty,
                    new TendMetrics(store), Clock.systemUTC(), new PrintWriter(System.err, true),
                    PlaybookLoader.load(root.resolve("playbooks/library"))));
            try {
                HttpClient http = HttpClient.newHttpClient();
                String base = "http://127.0.0.1:" + api.port();
                String query = "since=" + night.since() + "&until=" + night.until();
                rows.add(row("GET handover (JSON) of the night", floor,
                        median(() -> get(http, base + "/api/v1/handover?" + query)), 500));
                String oldNight = "since=" + night.since().minus(Duration.ofDays(14)) + "&until=" + night.until().minus(Duration.ofDays(14));
                String[][] pages = {
                        {"", ""},
                        {"kind=run-started", " AND kind = 'run-started'"},
                        {"kind=brake-engaged", " AND kind = 'brake-engaged'"},
                        {"cluster=fares-17", " AND cluster = 'fares-17'"},
                        {"kind=verdict&cluster=dispatch-3", " AND kind = 'verdict' AND cluster = 'dispatch-3'"},
                        {"playbook=restart-stopped-process&" + query, " AND playbook = 'restart-stopped-process'" + between(night)},
                        {"run=r0000100", " AND run = 'r0000100'"},
                        {oldNight, between(ReportPeriod.of(night.since().minus(Duration.ofDays(14)), night.until().minus(Duration.ofDays(14))))},
                        {"kind=run-ended&" + oldNight, " AND kind = 'run-ended'" + between(ReportPeriod.of(
                                night.since().minus(Duration.ofDays(14)), night.until().minus(Duration.ofDays(14))))},
                };
                for (String[] p : pages) {
                    String sql = "SELECT seq, at_ns, kind, cluster, playbook, run, entry, prev_hash, hash FROM ledger"
                            + " WHERE seq < 9223372036854775807" + p[1] + " ORDER BY seq DESC LIMIT 501";
                    Measure f = median(() -> {
                        try (PreparedStatement s = jdbc.prepareStatement(sql)) {
                            return LedgerRowsFloor.drain(s);
                        }
                    });
                    Measure t = median(() -> get(http, base + "/api/v1/ledger?" + p[0]));
                    rows.add(row("GET ledger?" + (p[0].isEmpty() ? "(no filter)" : p[0].replace(night.since().toString(), "NIGHT")
                            .replace(night.until().toString(), "END")), f, t, 200));
                }
            } finally {
                api.close();
            }
        }
        if (!"no".equals(LiveBenchmark.arg(args, "--cli", "yes"))) {
            Path dir = Files.createTempDirectory("tend-ledger-scale");
            String launcher = root.resolve("bin/tend").toString();
            ColdReplayBenchmark.run(dir, "version", List.of(launcher, "--version"), 0);
            List<String> handover = List.of(launcher, "handover", "--db", db.toString(), "--since", night.since().toString(),
                    "--until", night.until().toString());
            List<String> floorCommand = List.of(ChildProcess.java(), "-cp", BenchClasspath.ofThisProcess(),
                    LedgerRowsFloor.class.getName(), db.toString(), night.since().toString(), night.until().toString());
            double[][] t = new double[2][3];
            double[][] f = new double[2][3];
            for (int i = 0; i < 3; i++) {
                ColdReplayBenchmark.Timing bare = ColdReplayBenchmark.run(dir, "floor", floorCommand, 0);
                ColdReplayBenchmark.Timing cli = ColdReplayBenchmark.run(dir, "handover", handover, 0);
                f[0][i] = bare.wall() * 1000;
                f[1][i] = bare.cpu() * 1000;
                t[0][i] = cli.wall() * 1000;
                t[1][i] = cli.cpu() * 1000;
            }
            rows.add(row("bin/tend handover, a fresh process", new Measure(middle(f[0]), middle(f[1])),
                    new Measure(middle(t[0]), middle(t[1])), 500));
        }
        System.out.printf(Locale.ROOT, "%-62s %9s %9s %6s %21s %10s%n", "", "floor ms", "tend ms", "ratio", "CPU ms floor / tend",
                "target");
        for (String[] r : rows) System.out.printf(Locale.ROOT, "%-62s %9s %9s %6s %21s %10s%n", (Object[]) r);
        System.out.printf("(wall-clock medians; ratio: floor / tend by the wall clock; %s)%n", ChildProcess.load());
    }

    private static String between(ReportPeriod p) {
        return " AND at_ns >= " + LedgerRowsFloor.nanos(p.since()) + " AND at_ns < " + LedgerRowsFloor.nanos(p.until());
    }

    private static String[] row(String what, Measure floor, Measure tend, int targetMs) {
        return new String[]{what, String.format(Locale.ROOT, "%.1f", floor.wall()), String.format(Locale.ROOT, "%.1f", tend.wall()),
                String.format(Locale.ROOT, "%.2f", floor.wall() / tend.wall()),
                String.format(Locale.ROOT, "%.1f / %.1f", floor.cpu(), tend.cpu()),
                (tend.wall() < targetMs ? "met < " : "NOT < ") + targetMs};
    }

    private static Object get(HttpClient http, String url) throws Exception {
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create(url)).header("Authorization", "Bearer " + TOKEN).build(),
                HttpResponse.BodyHandlers.ofString());
        if (r.statusCode() != 200) throw new IllegalStateException(url + " answered " + r.statusCode() + ": " + r.body());
        return r.body().length();
    }

    /** Something measured; returns anything, so that the work is not optimised away. */
    private interface Work {
        Object run() throws Exception;
    }

    /** Wall and CPU milliseconds (the CPU time of this whole process: every thread, the JIT's and collector's too). */
    record Measure(double wall, double cpu) {
    }

    /** One round of warm-up, then the medians of {@link #ROUNDS} rounds. */
    private static Measure median(Work w) throws Exception {
        w.run();
        double[] ms = new double[ROUNDS];
        double[] cpu = new double[ROUNDS];
        for (int i = 0; i < ROUNDS; i++) {
            long c0 = ChildProcess.ownCpuNanos();
            long t0 = System.nanoTime();
            w.run();
            ms[i] = (System.nanoTime() - t0) / 1e6;
            cpu[i] = (ChildProcess.ownCpuNanos() - c0) / 1e6;
        }
        return new Measure(middle(ms), middle(cpu));
    }

    private static double middle(double[] values) {
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        return sorted[sorted.length / 2];
    }

    /** The API's write side: this benchmark only reads. */
    private static Gateway readOnly() {
        return new Gateway() {
            @Override
            public List<Effect> command(Input.Command command) {
                throw new IllegalStateException("the ledger scale benchmark only reads");
            }

            @Override
            public void events(List<Input> events, LedgerDraft receipt) {
                throw new IllegalStateException("the ledger scale benchmark only reads");
            }
        };
    }
}
