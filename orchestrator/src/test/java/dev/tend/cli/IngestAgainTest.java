package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

/** Reading a file again (after a crash, or by mistake) never journals an event twice, and no line stops ingest. */
class IngestAgainTest {
    private static final Path ROOT = CliRun.root();
    private static final String LIBRARY = ROOT.resolve("playbooks/library").toString();
    private static final String FLEET = ROOT.resolve("playbooks/library/fleet.yaml").toString();

    @TempDir
    Path dir;

    private static String lines(int from, int to, int poisoned) {
        StringBuilder sb = new StringBuilder();
        Instant t0 = Instant.parse("2026-03-14T02:00:00Z");
        for (int i = from; i <= to; i++) {
            String at = i == poisoned ? "2263-01-01T00:00:00Z" : t0.plusSeconds(i).toString();
            sb.append("{\"at\":\"").append(at).append("\",\"cluster\":\"tickets-").append(i % 30 + 1)
                    .append("\",\"node\":\"n1\",\"signal\":\"disk-latency\",\"state\":\"").append(i % 2 == 0 ? "clear" : "breach")
                    .append("\"}\n");
        }
        return sb.toString();
    }

    private static long journalRows(String db) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement();
             ResultSet r = s.executeQuery("SELECT count(*) FROM input_journal WHERE kind = 'transition'")) {
            r.next();
            return r.getLong(1);
        }
    }

    private CliRun ingest(Path file, String db) {
        return CliRun.of("ingest", file.toString(), "--playbooks", LIBRARY, "--fleet", FLEET, "--db", db);
    }

    @Test
    void aFileReadAgainJournalsOnlyTheEventsAddedSince() throws Exception {
        Path file = dir.resolve("events.jsonl");
        String db = dir.resolve("tend.db").toString();
        Files.writeString(file, lines(1, 300, -1), StandardCharsets.UTF_8);
        assertThat(ingest(file, db).exit()).isZero();
        assertThat(journalRows(db)).isEqualTo(300);

        CliRun again = ingest(file, db);
        assertThat(again.exit()).as(again.err()).isZero();
        assertThat(again.err()).contains("the first 300 events of " + file + " are already journaled");
        assertThat(journalRows(db)).isEqualTo(300);

        Files.writeString(file, lines(301, 350, -1), StandardCharsets.UTF_8, StandardOpenOption.APPEND);
        assertThat(ingest(file, db).exit()).isZero();
        assertThat(journalRows(db)).isEqualTo(350);
    }

    @Test
    void aLineAtATimeTheStoreCannotHoldIsRefusedAndEveryRestartGoesOnWithoutDuplicates() throws Exception {
        Path file = dir.resolve("poisoned.jsonl");
        String db = dir.resolve("p.db").toString();
        Files.writeString(file, lines(1, 283, 150), StandardCharsets.UTF_8);
        CliRun first = ingest(file, db);
        assertThat(first.exit()).as(first.err()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(first.err()).contains("2263-01-01T00:00:00Z").doesNotContain("\tat ");
        assertThat(journalRows(db)).isEqualTo(282);
        for (int restart = 0; restart < 2; restart++) {
            CliRun again = ingest(file, db);
            assertThat(again.exit()).as(again.err()).isLessThan(ExitCodes.USAGE);
            assertThat(journalRows(db)).isEqualTo(282);
        }
        assertThat(CliRun.of("audit", "verify", "--db", db).exit()).isZero();
    }
}
