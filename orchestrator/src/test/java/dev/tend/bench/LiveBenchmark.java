package dev.tend.bench;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicLong;

/**
 * The live path as a health pipeline feels it, over real HTTP on loopback, in one run:
 * {@code tend serve} as its own process (the jar, the bundled playbooks, a SQLite store) and
 * the floor, a bare endpoint on the same server stack that only parses the body
 * ({@link BareEndpoint}, also its own process), both up at once. For each: a warm-up, then an
 * idle server answering one one-line {@code POST /api/v1/transitions} at a time (p50/p99);
 * then rounds of 16 keep-alive connections posting one line per request as fast as they are
 * answered (rate, p50/p99), the floor and tend in turn. Prints the figures, the median of the
 * rounds' ratios tend/floor and the load. Not a test: run it with
 * {@code -Pbench} (see DEVELOPERS.md).
 *
 * <p>Arguments: {@code --jar FILE --test-classes DIR --library DIR [--seconds S]
 * [--connections C] [--idle-requests N] [--clusters N] [--warmup S] [--warm-idle yes|no] [--rounds R]
 * [--serve-java-options "..."]}.
 */
public final class LiveBenchmark {
    private LiveBenchmark() {
    }

    /** What one measurement found. */
    record Figures(long requests, long failures, double seconds, long[] latencyNanos, long serverCpuNanos) {
        Figures withServerCpu(long nanos) {
            return new Figures(requests, failures, seconds, latencyNanos, nanos);
        }

        double cpuMicrosPerRequest() {
            return serverCpuNanos < 0 ? Double.NaN : serverCpuNanos / 1e3 / requests;
        }

        double rate() {
            return requests / seconds;
        }

        double percentileMs(double p) {
            if (latencyNanos.length == 0) return Double.NaN;
            int i = (int) Math.ceil(p * latencyNanos.length) - 1;
            return latencyNanos[Math.max(0, Math.min(latencyNanos.length - 1, i))] / 1e6;
        }
    }

    public static void main(String[] args) throws Exception {
        Path jar = Path.of(arg(args, "--jar", "orchestrator/target/tend.jar"));
        Path testClasses = Path.of(arg(args, "--test-classes", "orchestrator/target/test-classes"));
        Path library = Path.of(arg(args, "--library", "playbooks/library"));
        int seconds = Integer.parseInt(arg(args, "--seconds", "8"));
        int connections = Integer.parseInt(arg(args, "--connections", "16"));
        int idleRequests = Integer.parseInt(arg(args, "--idle-requests", "400"));
        int clusters = Integer.parseInt(arg(args, "--clusters", "300"));
        // a server runs for days: its figures are those after the JIT compiled the request path,
        // and after what this mix sets off once: tend's fleet brake engages within 2 s (most
        // clusters soon carry a breached signal) and its page goes out brake-gather (30 s) later,
        // loading classes that throw away the driver's compiled code (-XX:+PrintCompilation:
        // Driver::process, Projections::apply and a dozen more made not entrant at once). With
        // 15 s that fell in the measured window: 0.84 to 0.91 s of C2 time in it against 0.07 s
        // with 40 s (one run each, 2026-12-04)
        int warmup = Integer.parseInt(arg(args, "--warmup", "40"));
        // and with the idle path too (see warm)
        boolean warmIdle = !arg(args, "--warm-idle", "yes").equals("no");
        Path dir = Files.createTempDirectory("tend-live-bench");
        Path fleet = dir.resolve("fleet.yaml");
        IngestMix.writeFleet(fleet, clusters);
        String token = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(dir.toString().getBytes(StandardCharsets.UTF_8)));
        String hash = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(token.getBytes(StandardCharsets.UTF_8)));
        Path tokens = dir.resolve("tokens.yaml");
        Files.writeString(tokens, "tokens:\n  - { name: bench-feed, roles: [operator], sha256: " + hash + " }\n");
        System.out.printf("live benchmark: %d connections, %d s each after %d s of warm-up, %d idle requests, %d clusters, in %s; %s%n",
                connections, seconds, warmup, idleRequests, clusters, dir, ChildProcess.load());
        List<String> jvm = List.of();
        String extra = arg(args, "--serve-java-options", "");
        List<String> serveJvm = extra.isBlank() ? jvm : List.of(extra.trim().split("\\s+"));

        // Both servers stay up; after each one's warm-up and idle pass, rounds of the 16 connections alternate
        // between them (the floor, then tend, --rounds times): this machine's speed moves by a quarter within
        // minutes, and a pair measured back to back shares its phase. The verdict is the median of the rounds'
        // ratios. A server not being measured is idle.
        int rounds = Integer.parseInt(arg(args, "--rounds", "3"));
        int floorPort = ChildProcess.freePort();
        int tendPort = ChildProcess.freePort();
        Figures floorIdle, tendIdle;
        List<Figures> floorLoads = new ArrayList<>(), tendLoads = new ArrayList<>();
        String floorThreads = "", tendThreads = "";
        long floorWarm, tendWarm;
        try (ChildProcess floor = ChildProcess.startAndAwait(ChildProcess.javaCommand(jvm, "-cp", jar + java.io.File.pathSeparator
                + testClasses, BareEndpoint.class.getName(), String.valueOf(floorPort)), dir.resolve("floor.log"), "listening on", 120);
             ChildProcess tend = ChildProcess.startAndAwait(ChildProcess.javaCommand(serveJvm, "-jar", jar.toString(), "serve",
                     "--playbooks", library.toString(), "--fleet", fleet.toString(), "--db", dir.resolve("live.db").toString(),
                     "--listen", "127.0.0.1:" + tendPort, "--tokens", tokens.toString()), dir.resolve("serve.log"), "tend: serving", 180)) {
            floorWarm = warm(floorPort, null, connections, warmup, warmIdle, idleRequests, clusters, floor.pid());
            long c0 = floor.cpuNanos();
            floorIdle = idle(floorPort, null, idleRequests, clusters).withServerCpu(floor.cpuNanos() - c0);
            tendWarm = warm(tendPort, token, connections, warmup, warmIdle, idleRequests, clusters, tend.pid());
            c0 = tend.cpuNanos();
            tendIdle = idle(tendPort, token, idleRequests, clusters).withServerCpu(tend.cpuNanos() - c0);
            for (int round = 1; round <= rounds; round++) {
                var threads = ThreadCpu.ofProcess(floor.pid());
                c0 = floor.cpuNanos();
                Figures f = load(floorPort, null, connections, seconds, clusters);
                floorLoads.add(f.withServerCpu(floor.cpuNanos() - c0));
                floorThreads = ThreadCpu.between(threads, ThreadCpu.ofProcess(floor.pid()));
                threads = ThreadCpu.ofProcess(tend.pid());
                c0 = tend.cpuNanos();
                Figures t = load(tendPort, token, connections, seconds, clusters);
                tendLoads.add(t.withServerCpu(tend.cpuNanos() - c0));
                tendThreads = ThreadCpu.between(threads, ThreadCpu.ofProcess(tend.pid()));
            }
        }
        System.out.printf("%-44s %12s %9s %9s %14s %7s%n", "", "requests/s", "p50 ms", "p99 ms", "server CPU/req", "failed");
        row("floor, idle (one request at a time)", floorIdle);
        row("tend,  idle (one request at a time)", tendIdle);
        List<Double> ratios = new ArrayList<>();
        for (int round = 0; round < rounds; round++) {
            String of = rounds > 1 ? ", round " + (round + 1) : "";
            row("floor, " + connections + " connections" + of, floorLoads.get(round));
            row("tend,  " + connections + " connections" + of, tendLoads.get(round));
            ratios.add(tendLoads.get(round).rate() / floorLoads.get(round).rate());
        }
        System.out.printf("warm-up: floor %d s, tend %d s (until the JIT compiler threads used under 5%% of the server's CPU for 3 s)%n",
                floorWarm, tendWarm);
        // where the servers' CPU went under load (the last round): the JIT compiler threads should be near idle by then
        System.out.printf("server threads' CPU during the %d connections: floor: %s%n", connections, floorThreads);
        System.out.printf("                                        tend: %s%n", tendThreads);
        System.out.printf("idle tend p99 = %.2f ms (target < 5 ms): %s%n", tendIdle.percentileMs(0.99),
                tendIdle.percentileMs(0.99) < 5 ? "met" : "NOT met");
        double ratio = IngestBenchmark.median(ratios);
        double rate = IngestBenchmark.median(tendLoads.stream().map(Figures::rate).toList());
        System.out.printf("ratio tend/floor, %d connections = %.2f, the median of %d rounds %s (target >= 0.50): %s; tend %,.0f"
                        + " transitions/s, the median (target >= 2,000): %s%n", connections, ratio, rounds,
                ratios.stream().map(r -> String.format(java.util.Locale.ROOT, "%.2f", r)).toList(), ratio >= 0.5 ? "met" : "NOT met",
                rate, rate >= 2000 ? "met" : "NOT met");
        System.out.printf("after: %s%n", ChildProcess.load());
        long failures = floorIdle.failures() + tendIdle.failures() + floorLoads.stream().mapToLong(Figures::failures).sum()
                + tendLoads.stream().mapToLong(Figures::failures).sum();
        if (failures > 0) throw new IllegalStateException("some requests failed; see the logs in " + dir);
    }

    private static void row(String what, Figures f) {
        System.out.printf("%-44s %12.0f %9.2f %9.2f %11.0f µs %7d%n", what, f.rate(), f.percentileMs(0.5), f.percentileMs(0.99),
                f.cpuMicrosPerRequest(), f.failures());
    }

    /**
     * Warms a server up and returns for how long, in seconds: {@code seconds} under
     * {@code connections}, then (with {@code idleToo}) as many idle requests as are measured
     * (a server sees quiet and busy spells alike), then slices of 3 s under the connections
     * until the JIT compiler threads used under 5% of the server's CPU in one, for at most twice
     * {@code seconds} more. On 2 shared cores under load, 15 s left the compiler threads busy
     * with tend's request path in the measured window: a sixth of its CPU there, 80 against
     * 66 µs per request with 45 s (one run each, 2026-12-03, load 11 to 21).
     */
    static long warm(int port, String token, int connections, int seconds, boolean idleToo, int idleRequests, int clusters,
                     long pid) throws Exception {
        long t0 = System.nanoTime();
        load(port, token, connections, seconds, clusters);
        if (idleToo) idle(port, token, idleRequests, clusters);
        long deadline = System.nanoTime() + 2L * seconds * 1_000_000_000L;
        while (true) {
            Map<String, Long> before = ThreadCpu.ofProcess(pid);
            load(port, token, connections, 3, clusters);
            Map<String, Long> after = ThreadCpu.ofProcess(pid);
            long all = 0, compilers = 0;
            for (Map.Entry<String, Long> e : after.entrySet()) {
                long used = e.getValue() - before.getOrDefault(e.getKey(), 0L);
                all += used;
                if (e.getKey().contains("Compiler")) compilers += used;
            }
            if (compilers * 20 <= all || System.nanoTime() > deadline) return Math.round((System.nanoTime() - t0) / 1e9);
        }
    }

    /** One connection, one one-line request at a time with a pause of 5 ms between: the server is idle at each. */
    static Figures idle(int port, String token, int n, int clusters) throws Exception {
        SplittableRandom random = new SplittableRandom(11);
        long[] lat = new long[n];
        long failures = 0;
        long t0 = System.nanoTime();
        try (LoopbackClient c = new LoopbackClient(port, "/api/v1/transitions", token)) {
            for (int i = 0; i < n; i++) {
                Thread.sleep(5);
                String line = line(random, clusters);
                long s = System.nanoTime();
                int status = c.post(line);
                lat[i] = System.nanoTime() - s;
                if (status != 200) failures++;
            }
        }
        Arrays.sort(lat);
        return new Figures(n, failures, (System.nanoTime() - t0) / 1e9, lat, -1);
    }

    /** {@code connections} connections, each posting one line per request, answered before the next, for {@code seconds}. */
    static Figures load(int port, String token, int connections, int seconds, int clusters) throws Exception {
        AtomicBoolean stop = new AtomicBoolean();
        AtomicLong failures = new AtomicLong();
        List<long[]> perThread = new ArrayList<>();
        int[] counts = new int[connections];
        List<Thread> threads = new ArrayList<>();
        List<Throwable> errors = java.util.Collections.synchronizedList(new ArrayList<>());
        for (int t = 0; t < connections; t++) {
            long[] lat = new long[1 << 20];
            perThread.add(lat);
            int me = t;
            Thread th = new Thread(() -> {
                SplittableRandom random = new SplittableRandom(100 + me);
                try (LoopbackClient c = new LoopbackClient(port, "/api/v1/transitions", token)) {
                    int k = 0;
                    while (!stop.get() && k < lat.length) {
                        String line = line(random, clusters);
                        long s = System.nanoTime();
                        int status = c.post(line);
                        lat[k++] = System.nanoTime() - s;
                        if (status != 200) failures.incrementAndGet();
                    }
                    counts[me] = k;
                } catch (Exception e) {
                    errors.add(e);
                }
            }, "bench-client-" + t);
            threads.add(th);
        }
        long t0 = System.nanoTime();
        for (Thread th : threads) th.start();
        Thread.sleep(seconds * 1000L);
        stop.set(true);
        for (Thread th : threads) th.join();
        double elapsed = (System.nanoTime() - t0) / 1e9;
        if (!errors.isEmpty()) throw new IllegalStateException("a client failed: " + errors.get(0), errors.get(0));
        int total = Arrays.stream(counts).sum();
        long[] all = new long[total];
        int at = 0;
        for (int t = 0; t < connections; t++) {
            System.arraycopy(perThread.get(t), 0, all, at, counts[t]);
            at += counts[t];
        }
        Arrays.sort(all);
        return new Figures(total, failures.get(), elapsed, all, -1);
    }

    /** One wire line: a noise signal of a random node, mostly clear, now. */
    static String line(SplittableRandom random, int clusters) {
        String[] signals = {"disk-latency", "gc-pause", "request-errors", "cpu-high"};
        int c = 1 + random.nextInt(clusters);
        int node = 1 + random.nextInt(4);
        String state = random.nextInt(10) == 0 ? "breach" : "clear";
        return "{\"at\":\"" + Instant.now() + "\",\"cluster\":\"bench-" + c + "\",\"node\":\"n" + node + "\",\"signal\":\""
                + signals[random.nextInt(signals.length)] + "\",\"state\":\"" + state + "\"}";
    }

    static String arg(String[] args, String name, String fallback) {
        for (int i = 0; i < args.length - 1; i++) {
            if (args[i].equals(name)) return args[i + 1];
        }
        return fallback;
    }
}
