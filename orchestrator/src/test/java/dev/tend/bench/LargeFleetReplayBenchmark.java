package dev.tend.bench;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * One day of a large fleet through {@code tend replay} with a heap of at most 1 GB (not a test;
 * see DEVELOPERS.md, "Benchmarks"): writes the day with {@code bin/tend record --synthesize
 * --clusters 25000 --days 1} (25,000 invented clusters, 100,000 nodes, about 1.9 million events,
 * and its fleet file), then times, each as a fresh process with {@code -Xmx1g}: the floor
 * ({@link JacksonFloor}: reading and parsing every line) and {@code bin/tend replay} of the day
 * with the bundled library. The replay's collector writes its log ({@code -Xlog:gc}); the peak
 * heap is the most it held when a collection began, and the most it kept after a full one
 * (what the replay retains). Prints wall and CPU time, events per second, the ratio to the
 * floor and the peaks. Target: the replay finishes within {@code -Xmx1g}.
 *
 * <p>Arguments: {@code --root DIR} (the repository: bin/tend, playbooks/library), and
 * optionally {@code --clusters N} (25000), {@code --days D} (1), {@code --heap SIZE} (1g),
 * {@code --dir DIR} (a new temporary folder).
 */
public final class LargeFleetReplayBenchmark {
    private static final Pattern GC = Pattern.compile("GC\\(\\d+\\) (Pause [A-Za-z]+).* (\\d+)M->(\\d+)M\\((\\d+)M\\)");

    private LargeFleetReplayBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        Path root = Path.of(LiveBenchmark.arg(args, "--root", ".")).toAbsolutePath().normalize();
        String clusters = LiveBenchmark.arg(args, "--clusters", "25000");
        String days = LiveBenchmark.arg(args, "--days", "1");
        String heap = LiveBenchmark.arg(args, "--heap", "1g");
        String dirArg = LiveBenchmark.arg(args, "--dir", null);
        Path dir = dirArg == null ? Files.createTempDirectory("tend-large-fleet") : Files.createDirectories(Path.of(dirArg));
        String tend = root.resolve("bin/tend").toString();
        Path recording = dir.resolve("day.jsonl");
        System.out.printf(Locale.ROOT, "large fleet replay benchmark: %s clusters, %s days, -Xmx%s, in %s; %s%n", clusters, days, heap,
                dir, ChildProcess.load());
        ColdReplayBenchmark.Timing record = ColdReplayBenchmark.run(dir, "record", List.of(tend, "record", "--synthesize",
                "--clusters", clusters, "--days", days, "--seed", "1", "--out", recording.toString()), 0);
        long events = Math.max(0, lines(recording) - 1);
        System.out.printf(Locale.ROOT, "recorded %,d events (%,d MB) in %.1f s%n", events, Files.size(recording) >> 20, record.wall());

        ColdReplayBenchmark.Timing floor = ColdReplayBenchmark.run(dir, "floor", List.of(ChildProcess.java(), "-Xmx" + heap, "-cp",
                BenchClasspath.ofThisProcess(), JacksonFloor.class.getName(), recording.toString()), 0);
        Path gcLog = dir.resolve("replay-gc.log");
        Files.deleteIfExists(gcLog);
        ColdReplayBenchmark.Timing replay = ColdReplayBenchmark.run(dir, "replay", List.of(tend, "replay", recording.toString(),
                "--playbooks", root.resolve("playbooks/library").toString(), "--format", "json", "--out",
                dir.resolve("report.json").toString()), -1, Map.of("TEND_JAVA_OPTS", "-Xmx" + heap + " -Xlog:gc:file=" + gcLog));
        String err = Files.readString(dir.resolve("replay.err"));
        if (err.contains("OutOfMemoryError") || !Files.exists(dir.resolve("report.json"))) {
            throw new IllegalStateException("the replay did not finish within -Xmx" + heap + "; see " + dir.resolve("replay.err"));
        }
        long[] peaks = peaks(gcLog);
        System.out.printf(Locale.ROOT, "%-40s %9s %9s %12s %13s%n", "", "wall s", "CPU s", "events/s", "ratio (wall)");
        System.out.printf(Locale.ROOT, "%-40s %9.2f %9.2f %,12.0f %13s%n", "floor (java -Xmx" + heap + ", Jackson tree)", floor.wall(),
                floor.cpu(), events / floor.wall(), "");
        System.out.printf(Locale.ROOT, "%-40s %9.2f %9.2f %,12.0f %13.2f%n", "bin/tend replay (-Xmx" + heap + ")", replay.wall(),
                replay.cpu(), events / replay.wall(), floor.wall() / replay.wall());
        System.out.printf(Locale.ROOT, "replay heap: at most %,d MB when a collection began, at most %,d MB kept after a full one,"
                + " %,d MB committed at most, %d collections (%d full); target: within -Xmx%s: met (the replay finished)%n",
                peaks[0], peaks[1], peaks[2], peaks[3], peaks[4], heap);
        System.out.printf("after: %s%n", ChildProcess.load());
    }

    private static long lines(Path file) throws Exception {
        try (var in = Files.lines(file)) {
            return in.count();
        }
    }

    /** {before-peak MB, after-full-peak MB, committed-peak MB, collections, full collections} from a -Xlog:gc file. */
    static long[] peaks(Path gcLog) throws Exception {
        long before = 0, afterFull = 0, committed = 0, count = 0, full = 0;
        List<String> lines = Files.exists(gcLog) ? Files.readAllLines(gcLog) : new ArrayList<>();
        for (String line : lines) {
            Matcher m = GC.matcher(line);
            if (!m.find()) continue;
            count++;
            before = Math.max(before, Long.parseLong(m.group(2)));
            committed = Math.max(committed, Long.parseLong(m.group(4)));
            if (m.group(1).equals("Pause Full")) {
                full++;
                afterFull = Math.max(afterFull, Long.parseLong(m.group(3)));
            }
        }
        return new long[]{before, afterFull, committed, count, full};
    }
}
