package dev.tend.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.replay.Replayer;
import dev.tend.shared.fleet.Fleet;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.ReportJson;
import dev.tend.simulator.synth.Synthesizer;

import java.io.BufferedReader;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * The replay benchmark (not a test; see DEVELOPERS.md, "Benchmarks"). In one run it writes a
 * synthetic week of a 2,000-cluster fleet (about a million events), measures the floor
 * (reading the file and parsing every line with Jackson into a tree, the least any replay
 * must do) and then the full replay of the same file through the engine, and prints both
 * rates and their ratio. Target: replay at least 0.3 x the floor, under 10 s on 2 cores.
 *
 * <p>Arguments (all optional): {@code --library DIR} (default playbooks/library),
 * {@code --clusters N} (2000), {@code --days D} (7), {@code --seed S} (1), {@code --dir DIR}
 * (a new temporary folder), {@code --rounds R} (1: measure floor and replay R times in the
 * same JVM; later rounds show the rates once the JIT has compiled the hot code).
 */
public final class ReplayBenchmark {
    // The library's tend.yaml brakes at 25 unhealthy clusters, sized for its 300-cluster fleet; on
    // 2,000 clusters the background noise alone keeps more than that unhealthy, so the benchmark
    // brakes at a share of the fleet instead (the zone outage still engages it).
    private static final String TEND_YAML = """
            brake:
              engage-at: { fraction: 0.08 }
              release-below: { fraction: 0.03 }
              auto-release: true
              page: oncall
            rate: 50/1h
            """;

    private ReplayBenchmark() {
    }

    public static void main(String[] args) throws IOException {
        Path library = Path.of("playbooks/library");
        int clusters = 2000, days = 7, rounds = 1;
        long seed = 1;
        Path dir = null;
        for (int i = 0; i + 1 < args.length; i += 2) {
            switch (args[i]) {
                case "--library" -> library = Path.of(args[i + 1]);
                case "--clusters" -> clusters = Integer.parseInt(args[i + 1]);
                case "--days" -> days = Integer.parseInt(args[i + 1]);
                case "--seed" -> seed = Long.parseLong(args[i + 1]);
                case "--dir" -> dir = Path.of(args[i + 1]);
                case "--rounds" -> rounds = Integer.parseInt(args[i + 1]);
                default -> throw new IllegalArgumentException("unknown option " + args[i]);
            }
        }
        if (dir == null) dir = Files.createTempDirectory("tend-bench");
        ThreadMXBean cpu = ManagementFactory.getThreadMXBean();
        System.out.printf(Locale.ROOT, "tend replay benchmark: %d clusters, %d days, seed %d, %d cores, java %s%n",
                clusters, days, seed, Runtime.getRuntime().availableProcessors(), System.getProperty("java.version"));

        Path recording = dir.resolve("synthetic.jsonl");
        long t0 = System.nanoTime();
        Synthesizer.Result written = Synthesizer.write(Synthesizer.Options.of(clusters, days, seed), recording);
        System.out.printf(Locale.ROOT, "synthesized  %,d events, %,d bytes in %.2f s%n", written.events(), Files.size(recording),
                (System.nanoTime() - t0) / 1e9);

        Path config = dir.resolve("tend.yaml");
        Files.writeString(config, TEND_YAML, StandardCharsets.UTF_8);
        PlaybookSet policy = PlaybookLoader.load(library, config);
        for (int round = 1; round <= rounds; round++) {
            if (rounds > 1) System.out.printf(Locale.ROOT, "round %d of %d%n", round, rounds);
            long c1 = cpu.getCurrentThreadCpuTime();
            t0 = System.nanoTime();
            long lines = floor(recording);
            double floorSeconds = (System.nanoTime() - t0) / 1e9;
            double floorCpu = (cpu.getCurrentThreadCpuTime() - c1) / 1e9;
            double floorRate = lines / floorSeconds;
            System.out.printf(Locale.ROOT, "floor        %,d lines parsed by Jackson in %.2f s (%.2f s CPU): %,.0f lines/s%n",
                    lines, floorSeconds, floorCpu, floorRate);

            Recording rec = Recording.open(recording);
            Fleet fleet = rec.headerFleet().orElseThrow();
            c1 = cpu.getCurrentThreadCpuTime();
            t0 = System.nanoTime();
            ReplayReport report = Replayer.of(policy, fleet, seed).replay(rec);
            double replaySeconds = (System.nanoTime() - t0) / 1e9;
            double replayCpu = (cpu.getCurrentThreadCpuTime() - c1) / 1e9;
            double replayRate = report.recording().events() / replaySeconds;
            System.out.printf(Locale.ROOT, "replay       %,d events replayed in %.2f s (%.2f s CPU on the replaying thread; the"
                    + " recording is parsed on a second one): %,.0f events/s%n", report.recording().events(), replaySeconds, replayCpu, replayRate);
            System.out.printf(Locale.ROOT, "ratio        replay / floor = %.2f by wall clock, %.2f by CPU (target >= 0.30); replay %s 10 s%n",
                    replayRate / floorRate, floorCpu / replayCpu, replaySeconds < 10 ? "under" : "NOT under");
            if (round == rounds) {
                System.out.printf(Locale.ROOT, "what it found: %d runs started (%d succeeded, %d failed), %,d held and %,d denied decisions,"
                                + " %d approvals requested, %d brake periods, %,d hidden events, %,d notifications%n",
                        report.summary().runsStarted(), report.summary().runsSucceeded(), report.summary().runsFailed(),
                        report.summary().held(), report.summary().denied(), report.summary().approvalsRequested(),
                        report.brakePeriods().size(), report.summary().hiddenEvents(), report.notifications().size());
                t0 = System.nanoTime();
                int chars = ReportJson.toJson(report).length();
                System.out.printf(Locale.ROOT, "report       JSON of %,d characters rendered in %.2f s (not counted above)%n", chars,
                        (System.nanoTime() - t0) / 1e9);
            }
        }
    }

    /** Reads every line and parses it into a Jackson tree; returns the lines parsed. */
    private static long floor(Path file) throws IOException {
        ObjectMapper json = new ObjectMapper();
        long n = 0, fields = 0;
        try (BufferedReader in = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            String line;
            while ((line = in.readLine()) != null) {
                JsonNode node = json.readTree(line);
                fields += node.size();
                n++;
            }
        }
        if (fields == 0) throw new IllegalStateException("the floor parsed nothing");
        return n;
    }
}
