package dev.tend.bench;

import java.io.BufferedWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.PriorityQueue;
import java.util.Set;
import java.util.SplittableRandom;

/**
 * The ingest benchmark's input: a week of an invented fleet's health pipeline, as it would
 * send it. Most lines repeat that a signal is still clear; short breaches of noise signals
 * open and clear within minutes; and problems the bundled playbooks act on: nodes that go
 * silent for minutes (replace-silent-node confirms after 5m), processes that stop
 * (restart-stopped-process, 2m), some with a full disk on the same node (masked), some with a
 * second node of the cluster down at once (blast radius), some flapping. Problems open on
 * about 1.5 % of the lines, so at least 1 % of the transitions lead to a decision.
 */
final class IngestMix {
    private static final String[] NOISE = {"disk-latency", "gc-pause", "request-errors", "cpu-high"};
    private static final String[] STATUS = {"heartbeat", "process-down", "disk-latency", "gc-pause", "request-errors",
            "cpu-high", "storage-full"};

    private IngestMix() {
    }

    /** A line due at a later position of the file. */
    private record Later(long at, int seq, String cluster, String node, String signal, String state, boolean ends) {
    }

    /** The fleet: {@code clusters} clusters of four nodes in three zones, standard and bulk tiers (no approvals). */
    static void writeFleet(Path file, int clusters) throws Exception {
        try (BufferedWriter w = Files.newBufferedWriter(file)) {
            w.write("# invented benchmark fleet\nfleet: larkspur-bench\nclusters:\n");
            String[] tiers = {"standard", "bulk"};
            for (int c = 1; c <= clusters; c++) {
                w.write("  - id: bench-" + c + "\n    tags: { tier: " + tiers[c % 2] + ", kind: broker }\n"
                        + "    replication: { factor: 3, min-healthy: 2 }\n    nodes:\n");
                for (int n = 1; n <= 4; n++) w.write("      - { id: n" + n + ", zone: z-" + (char) ('a' + (n + c) % 3) + " }\n");
            }
        }
    }

    /** Writes {@code n} lines, 600 ms apart in event time (a million lines: about a week). */
    static void writeEvents(Path file, int n, int clusters) throws Exception {
        SplittableRandom random = new SplittableRandom(7);
        // a week in the past (a Sunday, as the first week of this mix was): `tend ingest` refuses events ahead of the wall clock
        long start = Instant.parse("2026-03-15T00:00:00Z").toEpochMilli();
        PriorityQueue<Later> later = new PriorityQueue<>((a, b) -> a.at() != b.at() ? Long.compare(a.at(), b.at()) : Integer.compare(a.seq(), b.seq()));
        Set<String> busy = new HashSet<>(); // nodes with a problem open: one at a time per node
        int seq = 0;
        try (BufferedWriter w = Files.newBufferedWriter(file)) {
            for (int i = 0; i < n; i++) {
                long t = start + 600L * i;
                Later due = later.peek();
                if (due != null && due.at() <= t) {
                    later.poll();
                    write(w, t, due.cluster(), due.node(), due.signal(), due.state());
                    if (due.ends()) busy.remove(due.cluster() + "/" + due.node());
                    continue;
                }
                String cluster = "bench-" + (1 + random.nextInt(clusters));
                String node = "n" + (1 + random.nextInt(4));
                int roll = random.nextInt(1000);
                if (roll < 15 && busy.add(cluster + "/" + node)) {
                    List<Later> episode = problem(random, t, cluster, node, busy);
                    for (Later l : episode) later.add(new Later(l.at(), seq++, l.cluster(), l.node(), l.signal(), l.state(), l.ends()));
                    Later first = later.poll();
                    write(w, t, first.cluster(), first.node(), first.signal(), first.state());
                } else if (roll < 120) {
                    // a short breach of a noise signal, clear within seconds to minutes
                    String signal = NOISE[random.nextInt(NOISE.length)];
                    write(w, t, cluster, node, signal, "breach");
                    later.add(new Later(t + 1000L * (5 + random.nextInt(120)), seq++, cluster, node, signal, "clear", false));
                } else if (!busy.contains(cluster + "/" + node)) {
                    // still fine: a repeated clear
                    write(w, t, cluster, node, STATUS[random.nextInt(STATUS.length)], "clear");
                } else {
                    write(w, t, cluster, node, NOISE[random.nextInt(NOISE.length)], "clear");
                }
            }
        }
    }

    /** The lines of one problem, the first at {@code t}; the last clears it and frees the node. */
    private static List<Later> problem(SplittableRandom random, long t, String cluster, String node, Set<String> busy) {
        List<Later> out = new ArrayList<>();
        int kind = random.nextInt(10);
        boolean silent = kind < 5;
        String signal = silent ? "heartbeat" : "process-down";
        String state = silent ? "silent" : "breach";
        long lasts = 1000L * (silent ? 240 + random.nextInt(480) : 60 + random.nextInt(300));
        out.add(new Later(t, 0, cluster, node, signal, state, false));
        if (kind == 5 || kind == 6) {
            // flapping: back and forth a few times within minutes, then it stays
            for (int k = 1; k <= 8; k++) out.add(new Later(t + k * 20_000L, 0, cluster, node, signal, k % 2 == 1 ? "clear" : state, false));
        }
        if (kind == 7) {
            // the owner's full disk explains it: the playbooks are masked on it
            out.add(new Later(t + 1000, 0, cluster, node, "storage-full", "breach", false));
            out.add(new Later(t + lasts - 1000, 0, cluster, node, "storage-full", "clear", false));
        }
        if (kind == 8) {
            // a second node of the cluster at the same time: blast radius and replicas
            String other = node.equals("n1") ? "n2" : "n1";
            if (busy.add(cluster + "/" + other)) {
                out.add(new Later(t + 2000, 0, cluster, other, signal, state, false));
                out.add(new Later(t + lasts + 2000, 0, cluster, other, signal, "clear", true));
            }
        }
        // still in trouble: the pipeline repeats it every 30 s
        long repeatFrom = t + (kind == 5 || kind == 6 ? 180_000 : 30_000);
        for (long r = repeatFrom; r < t + lasts; r += 30_000) out.add(new Later(r, 0, cluster, node, signal, state, false));
        out.add(new Later(t + lasts, 0, cluster, node, signal, "clear", true));
        return out;
    }

    private static void write(BufferedWriter w, long t, String cluster, String node, String signal, String state) throws Exception {
        w.write("{\"at\":\"" + Instant.ofEpochMilli(t) + "\",\"cluster\":\"" + cluster + "\",\"node\":\"" + node + "\",\"signal\":\""
                + signal + "\",\"state\":\"" + state + "\"}\n");
    }
}
