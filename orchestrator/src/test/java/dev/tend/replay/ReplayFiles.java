package dev.tend.replay;

import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.ReplayReport;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * Real files for replay tests, written into a test's temporary folder: a playbook directory
 * (actions with fixed durations, so times can be asserted), a small Larkspur fleet, and
 * recordings with a header naming the fleet.
 */
final class ReplayFiles {
    static final Instant T0 = Instant.parse("2027-03-16T01:00:00Z");

    static final String ACTIONS = """
            actions:
              drain-node: { simulated: { duration: 1m, success: 1.0 } }
              replace-node: { simulated: { duration: 2m, success: 1.0, clears: [heartbeat] } }
              restart-process: { simulated: { duration: 30s, success: 1.0, clears: [process-down] } }
            """;

    static final String FLEET = """
            fleet: larkspur-test
            clusters:
              - id: tickets-12
                tags: { tier: standard, team: ticketing }
                replication: { factor: 3, min-healthy: 2 }
                nodes: [{ id: n1, zone: z-c }, { id: n2, zone: z-a }, { id: n3, zone: z-b }]
              - id: tickets-13
                tags: { tier: standard, team: ticketing }
                replication: { factor: 3, min-healthy: 2 }
                nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }]
              - id: fares-3
                tags: { tier: critical, team: payments }
                replication: { factor: 3, min-healthy: 2 }
                nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }]
            """;

    static String replacePlaybook(String confirmFor) {
        return """
                playbook: replace-silent-node
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: %s }
                unless:
                  - { signal: storage-full, on: node }
                limits: { cooldown: 6h }
                approval: { clusters: { tier: [critical] }, expires-after: 30m }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: replace, action: replace-node, timeout: 30m }
                  - { id: settle, wait-healthy: [heartbeat], within: 20m }
                on-failure:
                  - { page: oncall, message: "replacing {node} in {cluster} failed at {step}" }
                """.formatted(confirmFor);
    }

    static final String RESTART = """
            playbook: restart-stopped-process
            version: 1
            trigger: { signal: process-down, state: breach, scope: node, confirm-for: 2m }
            unless:
              - { signal: storage-full, on: node }
            steps:
              - { id: restart, action: restart-process, timeout: 5m }
            """;

    private final Path dir;

    ReplayFiles(Path dir) {
        this.dir = dir;
    }

    /** A playbook directory {@code name} with the given actions.yaml and playbooks (file name to text). */
    Path playbooks(String name, String actions, String... playbooks) {
        Path p = dir.resolve(name);
        write(p.resolve("actions.yaml"), actions);
        for (int i = 0; i < playbooks.length; i++) write(p.resolve("p" + i + ".yaml"), playbooks[i]);
        return p;
    }

    Path fleet() {
        Path f = dir.resolve("fleet.yaml");
        if (!Files.exists(f)) write(f, FLEET);
        return f;
    }

    /** A recording {@code name} with a header naming fleet.yaml; {@code until} may be null. */
    Path recording(String name, Instant until, List<String> lines) {
        fleet();
        List<String> all = new ArrayList<>();
        all.add("{\"recording\":\"" + name + "\",\"fleet\":\"fleet.yaml\",\"from\":\"" + T0 + "\""
                + (until == null ? "" : ",\"until\":\"" + until + "\"") + ",\"description\":\"test recording\"}");
        all.addAll(lines);
        Path f = dir.resolve(name + ".jsonl");
        write(f, String.join("\n", all) + "\n");
        return f;
    }

    static String event(Duration after, String cluster, String node, String signal, String state) {
        return "{\"at\":\"" + T0.plus(after) + "\",\"cluster\":\"" + cluster + "\"" + (node == null ? "" : ",\"node\":\"" + node + "\"")
                + ",\"signal\":\"" + signal + "\",\"state\":\"" + state + "\"}";
    }

    static String minute(int m, String cluster, String node, String signal, String state) {
        return event(Duration.ofMinutes(m), cluster, node, signal, state);
    }

    static ReplayReport replay(Path playbooks, Path recording, long seed) {
        PlaybookSet set = PlaybookLoader.load(playbooks);
        Recording rec = Recording.open(recording);
        Fleet fleet = rec.headerFleet().orElseGet(() -> FleetFile.load(recording.resolveSibling("fleet.yaml")));
        return Replayer.of(set, fleet, seed).replay(rec);
    }

    /** The repository root, found from the module's working directory during the build. */
    static Path root() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !p.resolve("playbooks/library").toFile().isDirectory()) p = p.getParent();
        if (p == null) throw new IllegalStateException("cannot find the repository root from " + Path.of("").toAbsolutePath());
        return p;
    }

    private static void write(Path file, String text) {
        try {
            Files.createDirectories(file.getParent());
            Files.writeString(file, text);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
