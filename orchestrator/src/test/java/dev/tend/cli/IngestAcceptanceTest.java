package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;

import static org.assertj.core.api.Assertions.assertThat;

class IngestAcceptanceTest {
    @TempDir
    Path dir;

    @Test
    void aSilentNodeThatComesBackWhileBeingDrainedIsNotReplacedTheRunStandsDownAndUndrainsIt() throws Exception {
        Path root = CliRun.root();
        String db = dir.resolve("tend.db").toString();
        CliRun ingest = CliRun.of("ingest", root.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        assertThat(ingest.out()).contains("1 started, 0 succeeded, 0 failed, 1 stood down");
        assertThat(ingest.err()).contains("tend: end of input after 20 events; waiting for the runs still executing");

        CliRun runs = CliRun.of("runs", "--db", db, "--format", "json");
        JsonNode list = new ObjectMapper().readTree(runs.out());
        assertThat(list).hasSize(1);
        assertThat(list.get(0).get("cluster").asText()).isEqualTo("fares-17");
        assertThat(list.get(0).get("node").asText()).isEqualTo("n2");
        assertThat(list.get(0).get("state").asText()).isEqualTo("stood-down");
        assertThat(list.get(0).get("outcome").asText()).startsWith("stood down (cleared): heartbeat is no longer in breach or silent");

        CliRun audit = CliRun.of("audit", "--db", db);
        assertThat(audit.out()).contains("verdict").contains("run-started").contains("executor-call")
                .contains("run-standing-down").contains("run-ended").contains("undrain-node").doesNotContain("replace-node");
        CliRun text = CliRun.of("runs", "--db", db);
        assertThat(text.out()).contains("stood-down");
        assertThat(CliRun.of("audit", "verify", "--db", db).exit()).isZero();

        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement()) {
            s.executeUpdate("UPDATE ledger SET entry = replace(entry, 'fares-17', 'fares-71') WHERE seq = 5");
        }
        CliRun verify = CliRun.of("audit", "verify", "--db", db);
        assertThat(verify.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(verify.out()).contains("entry 5 ");
    }

    @Test
    void aWaitHealthyStepThatMustWaitIsCommittedAndEndsWhenTheReplacementClearsTheSignal() throws Exception {
        Path root = CliRun.root();
        java.util.List<String> lines = java.nio.file.Files.readAllLines(root.resolve("examples/silent-node.jsonl"));
        Path input = dir.resolve("unrecovered.jsonl");
        java.nio.file.Files.write(input, lines.subList(0, lines.size() - 1)); // the node never recovers by itself
        String db = dir.resolve("wait.db").toString();
        CliRun ingest = CliRun.of("ingest", input.toString(), "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        assertThat(ingest.out()).contains("1 started, 1 succeeded");
        CliRun audit = CliRun.of("audit", "--db", db, "--kind", "step-started");
        assertThat(audit.out()).contains("step_kind=wait-healthy");
        assertThat(CliRun.of("audit", "--db", db, "--kind", "step-finished").out()).contains("signals cleared");
    }

    @Test
    void anActionsFileIsLaidOverTheLibrarysActionsAsInReplay() throws Exception {
        Path root = CliRun.root();
        Path actions = dir.resolve("failing-replace.yaml");
        java.nio.file.Files.writeString(actions, "actions:\n  replace-node: { simulated: { duration: 5m, success: 0.0 } }\n");
        String db = dir.resolve("overlay.db").toString();
        java.util.List<String> lines = java.nio.file.Files.readAllLines(root.resolve("examples/silent-node.jsonl"));
        Path input = dir.resolve("unrecovered.jsonl");
        java.nio.file.Files.write(input, lines.subList(0, lines.size() - 1)); // the node never recovers: the run reaches replace

        CliRun ingest = CliRun.of("ingest", input.toString(),
                "--playbooks", root.resolve("playbooks/library").toString(), "--actions", actions.toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600");

        // drain-node still comes from the library's actions.yaml; replace-node is the failing one laid over it
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        assertThat(ingest.out()).contains("1 started, 0 succeeded, 1 failed");
        assertThat(CliRun.of("audit", "--db", db, "--kind", "executor-call").out()).contains("action=drain-node", "action=replace-node");
    }
}
