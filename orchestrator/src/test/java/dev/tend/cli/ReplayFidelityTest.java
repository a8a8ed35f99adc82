package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Fidelity: what {@code tend ingest} decided live, with simulated executors, is what
 * {@code tend replay} decides on the recording exported from its journal, with the same seed:
 * the same verdicts with the same reason codes, in the same order, per playbook and target.
 *
 * <p>The scenario is chosen so that the two clocks cannot matter. Ingest takes processing
 * time from the wall clock and event time only from the events (the file is read in a blink);
 * the replay runs both on the virtual clock. So: no change window, no freeze, no approval
 * (all depend on processing time); at most one run, so cooldown, loop, rate limits and
 * concurrency caps are never reached; every target on its own cluster, so one run's timing
 * cannot touch another's blast radius; nothing recorded for the replaced node after its
 * problem began, so the moment the simulated clear arrives (wall-clock dependent in ingest)
 * changes no verdict; confirm-for and flapping run on event time, which both sides take from
 * the same events (filler events every 30 s carry ingest's event time past each confirmation).
 */
class ReplayFidelityTest {
    @TempDir
    Path dir;

    private static final Instant T0 = Instant.parse("2026-03-16T01:00:00Z");
    private static final ObjectMapper JSON = new ObjectMapper();

    private static String line(int seconds, String cluster, String node, String signal, String state) {
        return "{\"at\":\"" + T0.plus(Duration.ofSeconds(seconds)) + "\",\"cluster\":\"" + cluster + "\",\"node\":\"" + node
                + "\",\"signal\":\"" + signal + "\",\"state\":\"" + state + "\"}";
    }

    @Test
    void replayOfAnIngestedJournalGivesTheSameVerdictsWithTheSameReasonsInTheSameOrder() throws Exception {
        Path playbooks = dir.resolve("policy");
        Files.createDirectories(playbooks);
        Files.writeString(playbooks.resolve("actions.yaml"), """
                actions:
                  drain-node: { simulated: { duration: { min: 1m, max: 2m }, success: 1.0 } }
                  replace-node: { simulated: { duration: { min: 2m, max: 4m }, success: 1.0, clears: [heartbeat] } }
                  restart-process: { simulated: { duration: { min: 20s, max: 1m }, success: 1.0, clears: [process-down] } }
                """);
        Files.writeString(playbooks.resolve("replace-silent-node.yaml"), """
                playbook: replace-silent-node
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 3m }
                unless: [{ signal: storage-full, on: node }]
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: replace, action: replace-node, timeout: 30m }
                  - { id: settle, wait-healthy: [heartbeat], within: 20m }
                """);
        Files.writeString(playbooks.resolve("restart-stopped-process.yaml"), """
                playbook: restart-stopped-process
                version: 1
                trigger: { signal: process-down, state: breach, scope: node, confirm-for: 2m }
                unless: [{ signal: storage-full, on: node }]
                steps:
                  - { id: restart, action: restart-process, timeout: 5m }
                """);
        Path fleet = dir.resolve("fleet.yaml");
        StringBuilder f = new StringBuilder("fleet: larkspur-test\nclusters:\n");
        for (String c : List.of("tickets-12", "tickets-13", "dispatch-4", "schedules-9", "telemetry-7")) {
            f.append("  - id: ").append(c).append("\n    tags: { tier: standard }\n    replication: { factor: 3, min-healthy: 2 }\n")
                    .append("    nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }]\n");
        }
        Files.writeString(fleet, f.toString());

        List<String> lines = new ArrayList<>();
        lines.add(line(0, "tickets-12", "n2", "heartbeat", "silent"));        // confirmed at 3m: a run
        lines.add(line(30, "tickets-13", "n1", "storage-full", "breach"));    // the owner's full disk ...
        lines.add(line(60, "tickets-13", "n1", "process-down", "breach"));    // ... explains the stopped process: masked
        lines.add(line(90, "dispatch-4", "n3", "process-down", "breach"));    // clears before it is confirmed
        lines.add(line(150, "dispatch-4", "n3", "process-down", "clear"));
        for (int i = 0; i < 10; i++) {                                        // flapping: 10 changes in 200 s
            lines.add(line(300 + 20 * i, "schedules-9", "n2", "heartbeat", i % 2 == 0 ? "silent" : "clear"));
        }
        List<String> all = new ArrayList<>();
        for (int s = 0; s <= 1200; s += 30) all.add(line(s, "telemetry-7", "n1", "cpu-high", "clear")); // event time moves on
        all.addAll(lines);
        all.sort((a, b) -> a.substring(7, 27).compareTo(b.substring(7, 27)));
        Path events = dir.resolve("events.jsonl");
        Files.writeString(events, String.join("\n", all) + "\n");

        String db = dir.resolve("tend.db").toString();
        CliRun ingest = CliRun.of("ingest", events.toString(), "--playbooks", playbooks.toString(), "--fleet", fleet.toString(),
                "--db", db, "--speedup", "100000", "--seed", "7");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        assertThat(ingest.out()).contains("1 started, 1 succeeded");

        Path recording = dir.resolve("exported.jsonl");
        CliRun record = CliRun.of("record", "--db", db, "--from", T0.toString(), "--until", T0.plus(Duration.ofHours(1)).toString(),
                "--fleet", fleet.toString(), "--out", recording.toString());
        assertThat(record.exit()).as(record.err()).isZero();
        assertThat(record.err()).contains("1 clear transitions reported by simulated actions left out");

        CliRun replay = CliRun.of("replay", recording.toString(), "--playbooks", playbooks.toString(), "--seed", "7", "--format", "json");
        assertThat(replay.exit()).as(replay.err()).isZero();
        JsonNode report = JSON.readTree(replay.out());

        Map<String, List<String>> live = new TreeMap<>();
        try (Store store = Store.openSqlite(Path.of(db))) {
            store.read(r -> {
                r.forEachLedger(LedgerFilter.all().withKind("verdict"), e -> {
                    try {
                        add(live, JSON.readTree(e.entry()));
                    } catch (Exception ex) {
                        throw new IllegalStateException(ex);
                    }
                });
                return null;
            });
        }
        Map<String, List<String>> replayed = new TreeMap<>();
        report.get("decisions").forEach(d -> add(replayed, d));

        assertThat(replayed).isEqualTo(live);
        assertThat(live.get("replace-silent-node tickets-12/n2")).containsExactly("hold [unconfirmed]", "start []");
        assertThat(live.get("restart-stopped-process tickets-13/n1")).containsExactly("deny [masked, unconfirmed]", "deny [masked]");
        assertThat(live.get("restart-stopped-process dispatch-4/n3")).containsExactly("hold [unconfirmed]");
        assertThat(live.get("replace-silent-node schedules-9/n2")).contains("hold [unconfirmed, flapping]");
        assertThat(report.get("summary").get("runs_succeeded").asInt()).isEqualTo(1);
    }

    private static void add(Map<String, List<String>> out, JsonNode d) {
        String target = d.get("playbook").asText() + " " + d.get("cluster").asText()
                + (d.hasNonNull("node") ? "/" + d.get("node").asText() : "");
        List<String> reasons = new ArrayList<>();
        d.get("reasons").forEach(r -> reasons.add(r.asText()));
        out.computeIfAbsent(target, k -> new ArrayList<>()).add(d.get("verdict").asText() + " " + reasons.toString());
    }
}
