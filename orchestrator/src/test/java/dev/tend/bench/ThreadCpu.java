package dev.tend.bench;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Collectors;
import java.util.stream.Stream;

/**
 * CPU time of this JVM's threads by name, read from {@code /proc/self/task} (Linux): the
 * compiler and GC threads too, which {@code ThreadMXBean} does not list. Names are the
 * kernel's (15 characters at most) with digits dropped, so "C2 CompilerThre0" and "...1"
 * count together. Empty where {@code /proc} is not there.
 */
final class ThreadCpu {
    /** Clock ticks per second of {@code /proc}'s figures (USER_HZ; 100 on Linux everywhere in practice, no source). */
    private static final long TICKS_PER_SECOND = 100;

    private ThreadCpu() {
    }

    /** Milliseconds of CPU (user + system) so far, by thread name. */
    static Map<String, Long> byName() {
        return byName(Path.of("/proc/self/task"));
    }

    /** As {@link #byName()}, for the threads of the process {@code pid} (a server under measurement). */
    static Map<String, Long> ofProcess(long pid) {
        return byName(Path.of("/proc/" + pid + "/task"));
    }

    private static Map<String, Long> byName(Path tasks) {
        Map<String, Long> out = new TreeMap<>();
        if (!Files.isDirectory(tasks)) return out;
        try (Stream<Path> list = Files.list(tasks)) {
            for (Path t : list.toList()) {
                String stat;
                try {
                    stat = Files.readString(t.resolve("stat"));
                } catch (IOException gone) {
                    continue; // the thread ended meanwhile
                }
                int open = stat.indexOf('('), close = stat.lastIndexOf(')');
                String name = stat.substring(open + 1, close).replaceAll("[0-9]+", "#");
                String[] f = stat.substring(close + 2).split(" ");
                long ticks = Long.parseLong(f[11]) + Long.parseLong(f[12]); // utime, stime: fields 14 and 15 of proc(5)
                out.merge(name, ticks * 1000 / TICKS_PER_SECOND, Long::sum);
            }
        } catch (IOException e) {
            return out;
        }
        return out;
    }

    /** The threads' CPU since {@code before}, largest first, as "name 1.23 s" items (threads under 50 ms left out). */
    static String since(Map<String, Long> before) {
        return between(before, byName());
    }

    /** The threads' CPU from {@code before} to {@code after}, as {@link #since}. */
    static String between(Map<String, Long> before, Map<String, Long> after) {
        return after.entrySet().stream()
                .map(e -> Map.entry(e.getKey(), e.getValue() - before.getOrDefault(e.getKey(), 0L)))
                .filter(e -> e.getValue() >= 50)
                .sorted(Map.Entry.<String, Long>comparingByValue().reversed())
                .map(e -> String.format("%s %.2f s", e.getKey(), e.getValue() / 1000.0))
                .collect(Collectors.joining(", "));
    }
}
