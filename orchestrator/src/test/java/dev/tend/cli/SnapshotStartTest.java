package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** Start-up from a snapshot, the journal archived behind it, and snapshots this tend must not use. */
class SnapshotStartTest {
    @TempDir
    Path dir;

    private final Path root = CliRun.root();

    private CliRun ingest(String db, String... more) {
        String[] base = {"ingest", root.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "600"};
        String[] all = new String[base.length + more.length];
        System.arraycopy(base, 0, all, 0, base.length);
        System.arraycopy(more, 0, all, base.length, more.length);
        return CliRun.of(all);
    }

    private static long count(String db, String sql) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery(sql)) {
            rs.next();
            return rs.getLong(1);
        }
    }

    private static void execute(String db, String sql) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement()) {
            s.executeUpdate(sql);
        }
    }

    @Test
    void aRestartLoadsTheSnapshotReplaysOnlyTheTailAndTheArchivedJournalIsNotNeeded() throws Exception {
        String db = dir.resolve("tend.db").toString();
        CliRun first = ingest(db, "--snapshot-every", "3");
        assertThat(first.exit()).as(first.err()).isZero();
        // the example's node comes back while it is drained: the run's gate stands it down
        assertThat(first.out()).contains("1 started, 0 succeeded, 0 failed, 1 stood down");
        long journal = count(db, "SELECT MAX(seq) FROM input_journal");
        // a clean stop wrote a snapshot of everything
        assertThat(count(db, "SELECT MAX(seq) FROM snapshots")).isEqualTo(journal);
        assertThat(count(db, "SELECT COUNT(*) FROM snapshots")).isEqualTo(2);

        CliRun archive = CliRun.of("journal", "archive", "--db", db, "--before", "2200-01-01T00:00:00Z",
                "--to", dir.resolve("journal-1.jsonl").toString());
        assertThat(archive.exit()).as(archive.err()).isZero();
        List<String> archived = Files.readAllLines(dir.resolve("journal-1.jsonl"));
        assertThat(archived).hasSize((int) journal - 1); // the newest row stays: the next input's seq counts from it
        JsonNode firstRow = new ObjectMapper().readTree(archived.get(0));
        assertThat(firstRow.get("seq").asLong()).isEqualTo(1);
        assertThat(firstRow.get("payload").asText()).isNotEmpty();
        assertThat(count(db, "SELECT COUNT(*) FROM input_journal")).isEqualTo(1);

        // the same input again: resumes from the snapshot; the problem is already handled, no second run
        CliRun again = ingest(db);
        assertThat(again.exit()).as(again.err()).isZero();
        assertThat(again.err()).contains("snapshot at journal seq " + journal + " loaded, 0 journaled inputs replayed");
        CliRun runs = CliRun.of("runs", "--db", db, "--format", "json");
        assertThat(new ObjectMapper().readTree(runs.out())).hasSize(1);
        CliRun verify = CliRun.of("audit", "verify", "--db", db);
        assertThat(verify.exit()).as(verify.out()).isZero();
        assertThat(CliRun.of("audit", "--db", db, "--kind", "journal-archived").out()).contains("journal-archived");
    }

    @Test
    void aSnapshotOfANewerFormatIsRefusedClearly() throws Exception {
        String db = dir.resolve("tend.db").toString();
        assertThat(ingest(db).exit()).isZero();
        execute(db, "UPDATE snapshots SET format = 3");
        CliRun refused = ingest(db);
        assertThat(refused.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(refused.err()).contains("is in format 3, written by a newer tend; this tend reads formats up to 2");
    }

    @Test
    void anArchivedJournalWithoutItsSnapshotIsRefusedInsteadOfStartingFromHalfTheHistory() throws Exception {
        String db = dir.resolve("tend.db").toString();
        assertThat(ingest(db).exit()).isZero();
        assertThat(CliRun.of("journal", "archive", "--db", db, "--before", "2200-01-01T00:00:00Z",
                "--to", dir.resolve("a.jsonl").toString()).exit()).isZero();
        execute(db, "DELETE FROM snapshots");
        CliRun refused = ingest(db);
        assertThat(refused.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(refused.err()).contains("older inputs were archived").contains("no snapshot covers");
    }

    @Test
    void archivingNeedsASnapshotAndAppendsToAnArchiveThatExists() throws Exception {
        String db = dir.resolve("tend.db").toString();
        assertThat(ingest(db, "--snapshot-every", "0").exit()).isZero();
        CliRun none = CliRun.of("journal", "archive", "--db", db, "--before", "1h", "--to", dir.resolve("a.jsonl").toString());
        assertThat(none.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(none.err()).contains("has no snapshot yet");
        assertThat(dir.resolve("a.jsonl")).doesNotExist();

        assertThat(ingest(db).exit()).isZero(); // stops cleanly: a snapshot
        Path existing = Files.writeString(dir.resolve("b.jsonl"), "{\"seq\":0}\n");
        CliRun appended = CliRun.of("journal", "archive", "--db", db, "--before", "2200-01-01T00:00:00Z", "--to", existing.toString());
        assertThat(appended.exit()).as(appended.err()).isZero();
        List<String> lines = Files.readAllLines(existing);
        assertThat(lines.get(0)).isEqualTo("{\"seq\":0}");
        assertThat(lines).hasSizeGreaterThan(1);
    }

    @Test
    void aSnapshotTakenUnderAnotherPolicyIsSetAsideWhileTheWholeJournalCanBeReplayed() throws Exception {
        String db = dir.resolve("tend.db").toString();
        assertThat(ingest(db).exit()).isZero();
        execute(db, "UPDATE snapshots SET setup = 'another policy'");
        CliRun again = ingest(db);
        assertThat(again.exit()).as(again.err()).isZero();
        assertThat(again.err()).contains("resumed from").doesNotContain("snapshot at journal seq");
    }
}
