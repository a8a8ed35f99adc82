package dev.tend.bench;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;

/**
 * Replay as users run it (not a test; see DEVELOPERS.md, "Benchmarks"): every measurement is
 * a fresh process. It writes a synthetic week of a 2,000-cluster fleet with
 * {@code bin/tend record --synthesize}, runs {@code bin/tend --version} once (so that the
 * launcher has built its jar and class-data archive, as after any first run), then times
 * the floor ({@link JacksonFloor}: a plain {@code java} reading the file and parsing every
 * line with Jackson), {@code bin/tend replay} and {@code bin/tend replay --against} (a second
 * playbook directory, the same recording: twice the work). Prints wall and CPU time (user +
 * system of the process and its children) of each and the ratios floor/tend. Targets: the
 * replay under 10 s and at least 0.3 x the floor.
 *
 * <p>Arguments: {@code --root DIR} (the repository: bin/tend, playbooks/library),
 * {@code --jar FILE}, {@code --test-classes DIR}, and optionally {@code --clusters N} (2000),
 * {@code --days D} (7), {@code --seed S} (1), {@code --dir DIR} (a new temporary folder),
 * {@code --variants yes} (also the replay with the JVM's defaults, then with each start-up
 * setting of the launcher added in turn: what each gives).
 */
public final class ColdReplayBenchmark {
    private ColdReplayBenchmark() {
    }

    /** Wall and CPU seconds of one command. */
    record Timing(double wall, double cpu) {
    }

    public static void main(String[] args) throws Exception {
        Path root = Path.of(LiveBenchmark.arg(args, "--root", ".")).toAbsolutePath().normalize();
        Path jar = Path.of(LiveBenchmark.arg(args, "--jar", root.resolve("orchestrator/target/tend.jar").toString()));
        Path testClasses = Path.of(LiveBenchmark.arg(args, "--test-classes", root.resolve("orchestrator/target/test-classes").toString()));
        String clusters = LiveBenchmark.arg(args, "--clusters", "2000");
        String days = LiveBenchmark.arg(args, "--days", "7");
        String seed = LiveBenchmark.arg(args, "--seed", "1");
        String dirArg = LiveBenchmark.arg(args, "--dir", null);
        Path dir = dirArg == null ? Files.createTempDirectory("tend-cold-replay") : Files.createDirectories(Path.of(dirArg));
        String tend = root.resolve("bin/tend").toString();
        Path library = root.resolve("playbooks/library");
        Path recording = dir.resolve("week.jsonl");
        System.out.printf(Locale.ROOT, "cold replay benchmark: %s clusters, %s days, seed %s, in %s; %s%n", clusters, days, seed, dir,
                ChildProcess.load());
        run(dir, "record", List.of(tend, "record", "--synthesize", "--clusters", clusters, "--days", days, "--seed", seed,
                "--out", recording.toString()), 0);
        run(dir, "version", List.of(tend, "--version"), 0);
        Path changed = dir.resolve("library-changed");
        copy(library, changed);
        // the rehearsed change: the brake engages at 5 % of the fleet instead of 8 %
        Path config = changed.resolve("tend.yaml");
        Files.writeString(config, Files.readString(config).replace("engage-at: { fraction: 0.08 }", "engage-at: { fraction: 0.05 }"));

        Timing floor = run(dir, "floor", List.of(ChildProcess.java(), "-cp", jar + java.io.File.pathSeparator + testClasses,
                JacksonFloor.class.getName(), recording.toString()), 0);
        Timing replay = run(dir, "replay", List.of(tend, "replay", recording.toString(), "--playbooks", library.toString()), -1);
        Timing against = run(dir, "against", List.of(tend, "replay", recording.toString(), "--playbooks", library.toString(),
                "--against", changed.toString()), -1);
        List<String> replayArgs = List.of(tend, "replay", recording.toString(), "--playbooks", library.toString());
        java.util.Map<String, Timing> variants = new java.util.LinkedHashMap<>();
        if ("yes".equals(LiveBenchmark.arg(args, "--variants", "no"))) {
            // each start-up setting of the launcher on its own (TEND_REPLAY_OPTS empty: the JVM's C2 and G1)
            variants.put("  JVM defaults (no archive, C2, G1): before", run(dir, "plain", replayArgs, -1,
                    java.util.Map.of("TEND_CDS", "off", "TEND_REPLAY_OPTS", "")));
            variants.put("  + class-data archive", run(dir, "cds", replayArgs, -1, java.util.Map.of("TEND_REPLAY_OPTS", "")));
            variants.put("  + serial collector", run(dir, "serial", replayArgs, -1,
                    java.util.Map.of("TEND_REPLAY_OPTS", "-XX:+UseSerialGC")));
            variants.put("  + C1 only (the launcher's default)", replay);
        }
        System.out.printf(Locale.ROOT, "%-44s %9s %9s %13s %12s%n", "", "wall s", "CPU s", "ratio (wall)", "ratio (CPU)");
        row("floor (java, Jackson tree per line)", floor, floor);
        row("bin/tend replay", replay, floor);
        row("bin/tend replay --against (two policies)", against, floor);
        variants.forEach((what, t) -> row(what, t, floor));
        System.out.printf(Locale.ROOT, "replay %.1f s (target < 10 s): %s; ratio %.2f (target >= 0.30): %s%n", replay.wall(),
                replay.wall() < 10 ? "met" : "NOT met", floor.wall() / replay.wall(), floor.wall() / replay.wall() >= 0.3 ? "met" : "NOT met");
        System.out.printf("after: %s%n", ChildProcess.load());
    }

    private static void row(String what, Timing t, Timing floor) {
        System.out.printf(Locale.ROOT, "%-44s %9.2f %9.2f %13.2f %12.2f%n", what, t.wall(), t.cpu(), floor.wall() / t.wall(),
                floor.cpu() / t.cpu());
    }

    /**
     * Runs {@code command} through bash, which then prints the CPU time its children used
     * ({@code times}); output goes to files in {@code dir}. {@code exit}: the exit code
     * wanted, or -1 for 0 or 1 (a replay that found something).
     */
    static Timing run(Path dir, String name, List<String> command, int exit) throws IOException, InterruptedException {
        return run(dir, name, command, exit, java.util.Map.of());
    }

    static Timing run(Path dir, String name, List<String> command, int exit, java.util.Map<String, String> env)
            throws IOException, InterruptedException {
        Path out = dir.resolve(name + ".out");
        Path err = dir.resolve(name + ".err");
        Path times = dir.resolve(name + ".times");
        List<String> c = new ArrayList<>(List.of("bash", "-c", "\"$@\" >\"$OUT\" 2>\"$ERR\"; rc=$?; times >\"$TIMES\"; exit $rc", "bench"));
        c.addAll(command);
        ProcessBuilder pb = new ProcessBuilder(c).redirectErrorStream(true);
        pb.environment().put("OUT", out.toString());
        pb.environment().put("ERR", err.toString());
        pb.environment().put("TIMES", times.toString());
        pb.environment().putAll(env);
        long t0 = System.nanoTime();
        Process p = pb.start();
        p.getInputStream().transferTo(java.io.OutputStream.nullOutputStream());
        int rc = p.waitFor();
        double wall = (System.nanoTime() - t0) / 1e9;
        if (exit >= 0 ? rc != exit : rc > 1) {
            throw new IllegalStateException(name + " exited " + rc + "; see " + err);
        }
        // the second line of `times`: user and system time of the shell's children, e.g. "0m7.120s 0m0.310s"
        String[] lines = Files.readString(times, StandardCharsets.UTF_8).trim().split("\n");
        String[] f = lines[lines.length - 1].trim().split("\\s+");
        return new Timing(wall, seconds(f[0]) + seconds(f[1]));
    }

    private static double seconds(String t) {
        int m = t.indexOf('m');
        return Integer.parseInt(t.substring(0, m)) * 60 + Double.parseDouble(t.substring(m + 1, t.length() - 1));
    }

    private static void copy(Path from, Path to) throws IOException {
        try (Stream<Path> all = Files.walk(from)) {
            for (Path p : (Iterable<Path>) all::iterator) {
                Path target = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) Files.createDirectories(target);
                else Files.copy(p, target, java.nio.file.StandardCopyOption.REPLACE_EXISTING);
            }
        }
    }
}
