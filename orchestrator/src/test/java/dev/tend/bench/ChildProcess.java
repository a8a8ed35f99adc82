package dev.tend.bench;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.lang.management.ManagementFactory;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;

/**
 * A benchmark's server or command as its own process with the java running the benchmark:
 * started, waited for until it prints a line, stopped with SIGTERM. Output goes to a file in
 * the benchmark's folder, so a failure can be read afterwards.
 */
final class ChildProcess implements AutoCloseable {
    private final Process process;
    private final Path log;

    private ChildProcess(Process process, Path log) {
        this.process = process;
        this.log = log;
    }

    /** The java of this JVM. */
    static String java() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    /** A free port on loopback (free a moment ago). */
    static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }

    /** Starts {@code command} and waits (at most {@code seconds}) until a line of its output contains {@code ready}. */
    static ChildProcess startAndAwait(List<String> command, Path log, String ready, int seconds) throws Exception {
        ProcessBuilder pb = new ProcessBuilder(command).redirectErrorStream(true);
        Process p = pb.start();
        ChildProcess child = new ChildProcess(p, log);
        CompletableFuture<Boolean> seen = new CompletableFuture<>();
        Thread pump = new Thread(() -> {
            try (BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
                 var w = Files.newBufferedWriter(log)) {
                for (String line = r.readLine(); line != null; line = r.readLine()) {
                    w.write(line);
                    w.newLine();
                    w.flush();
                    if (line.contains(ready)) seen.complete(true);
                }
            } catch (IOException ignored) {
                // the process ended
            } finally {
                seen.complete(false);
            }
        }, "bench-child-output");
        pump.setDaemon(true);
        pump.start();
        boolean ok;
        try {
            ok = seen.get(seconds, TimeUnit.SECONDS);
        } catch (java.util.concurrent.TimeoutException e) {
            ok = false;
        }
        if (!ok) {
            child.close();
            throw new IllegalStateException("'" + String.join(" ", command) + "' did not print '" + ready + "'; see " + log);
        }
        return child;
    }

    /** The CPU time of this JVM's threads so far, in nanoseconds (for a ratio of CPU times). */
    static long ownCpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean()).getProcessCpuTime();
    }

    /** The process id (its threads' CPU: {@link ThreadCpu#ofProcess}). */
    long pid() {
        return process.pid();
    }

    /** The CPU time the process has used so far (user and system), in nanoseconds; -1 when unknown. */
    long cpuNanos() {
        return process.toHandle().info().totalCpuDuration().map(d -> d.toNanos()).orElse(-1L);
    }

    static List<String> javaCommand(List<String> jvmOptions, String... rest) {
        List<String> c = new ArrayList<>();
        c.add(java());
        c.addAll(jvmOptions);
        c.addAll(List.of(rest));
        return c;
    }

    /** The machine's load averages, as {@code uptime} prints them. */
    static String load() {
        try {
            String[] f = Files.readString(Path.of("/proc/loadavg")).trim().split("\\s+");
            return "load average: " + f[0] + ", " + f[1] + ", " + f[2];
        } catch (IOException e) {
            return "load average: unknown";
        }
    }

    @Override
    public void close() throws InterruptedException {
        process.destroy();
        if (!process.waitFor(30, TimeUnit.SECONDS)) {
            process.destroyForcibly();
            process.waitFor(10, TimeUnit.SECONDS);
        }
    }

    Path log() {
        return log;
    }
}
