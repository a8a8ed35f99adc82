package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.testing.EmbeddedPostgres;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/** The CLI on a real PostgreSQL store: the same journal, runs and ledger as on SQLite. */
class PostgresCliTest {
    @TempDir
    Path dir;

    private EmbeddedPostgres server;
    private String url;
    private Path passwordFile;

    @BeforeEach
    void database() throws Exception {
        server = EmbeddedPostgres.get();
        url = server.createDatabase();
        passwordFile = dir.resolve("pg-password");
        Files.writeString(passwordFile, "not-on-the-command-line\n");
    }

    @AfterEach
    void drop() {
        server.dropDatabase(url);
    }

    private CliRun tend(String... args) {
        String[] all = new String[args.length + 6];
        System.arraycopy(args, 0, all, 0, args.length);
        System.arraycopy(new String[]{"--db", url, "--db-user", server.user(), "--db-password-file", passwordFile.toString()},
                0, all, args.length, 6);
        return CliRun.of(all);
    }

    @Test
    void ingestRunsAuditAndVerifyWorkOnPostgres() throws Exception {
        Path root = CliRun.root();
        CliRun ingest = tend("ingest", root.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--speedup", "600");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        assertThat(ingest.out()).contains("1 started, 0 succeeded, 0 failed, 1 stood down"); // the node comes back while it is drained

        CliRun runs = tend("runs", "--format", "json");
        assertThat(runs.exit()).as(runs.err()).isZero();
        JsonNode list = new ObjectMapper().readTree(runs.out());
        assertThat(list).hasSize(1);
        assertThat(list.get(0).get("cluster").asText()).isEqualTo("fares-17");
        assertThat(list.get(0).get("state").asText()).isEqualTo("stood-down");

        CliRun audit = tend("audit");
        assertThat(audit.out()).contains("verdict").contains("run-started").contains("executor-call").contains("run-ended");
        CliRun verify = tend("audit", "verify");
        assertThat(verify.exit()).as(verify.out() + verify.err()).isZero();

        // A second ingest resumes from the same PostgreSQL journal: no second run for the same problem.
        CliRun again = tend("ingest", root.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--speedup", "600");
        assertThat(again.exit()).as(again.err()).isZero();
        assertThat(again.err()).contains("resumed from " + url);

        server.execute(url, "UPDATE ledger SET entry = replace(entry, 'fares-17', 'fares-71') WHERE seq = 5");
        CliRun tampered = tend("audit", "verify");
        assertThat(tampered.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(tampered.out()).contains("entry 5 ");
    }

    @Test
    void readingCommandsRefuseADatabaseWithoutAStoreAndLeaveItEmpty() {
        CliRun runs = tend("runs");
        assertThat(runs.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(runs.err()).contains("no tend store in the database at " + url);
        CliRun again = tend("audit", "verify");
        assertThat(again.err()).contains("no tend store");
    }

    @Test
    void aPasswordInTheUrlIsRefusedBeforeAnyConnection() {
        CliRun runs = CliRun.of("runs", "--db", url + "?user=postgres&password=hunter2");
        assertThat(runs.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(runs.err()).contains("--db-password-file").doesNotContain("hunter2");
    }
}
