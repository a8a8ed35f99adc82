package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

/** Reading input files: a line that is not UTF-8 is refused by its number and the rest is read, from a file or a pipe alike. */
class FileReadingTest {
    private static final Path ROOT = CliRun.root();
    private static final String LIBRARY = ROOT.resolve("playbooks/library").toString();
    private static final String FLEET = ROOT.resolve("playbooks/library/fleet.yaml").toString();
    private static final int LINES = 20_000;
    private static final int BAD_LINE = 10_000;

    @TempDir
    Path dir;

    /** 20,000 lines of disk-latency transitions, with one byte that is never UTF-8 (0xFF) on line 10,000. */
    private Path fileWithOneBadByte() throws Exception {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        Instant t0 = Instant.parse("2026-03-14T02:00:00Z");
        for (int i = 1; i <= LINES; i++) {
            String state = i % 2 == 0 ? "clear" : "breach";
            String line = "{\"at\":\"" + t0.plusSeconds(i) + "\",\"cluster\":\"tickets-" + (i % 40 + 1)
                    + "\",\"node\":\"n1\",\"signal\":\"disk-latency\",\"state\":\"" + state + "\",\"detail\":{\"note\":\"ok";
            b.write(line.getBytes(StandardCharsets.UTF_8));
            if (i == BAD_LINE) b.write(0xFF);
            b.write("\"}}\n".getBytes(StandardCharsets.UTF_8));
        }
        Path f = dir.resolve("latency.jsonl");
        Files.write(f, b.toByteArray());
        return f;
    }

    private static long journalRows(String db) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement();
             ResultSet r = s.executeQuery("SELECT count(*) FROM input_journal WHERE kind = 'transition'")) {
            r.next();
            return r.getLong(1);
        }
    }

    @Test
    void ingestOfAFileRefusesTheLineThatIsNotUtf8ByNumberAndReadsEveryOther() throws Exception {
        Path file = fileWithOneBadByte();
        String db = dir.resolve("file.db").toString();
        CliRun r = CliRun.of("ingest", file.toString(), "--playbooks", LIBRARY, "--fleet", FLEET, "--db", db);
        assertThat(r.exit()).as(r.err()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.err()).contains(file + ":" + BAD_LINE + ":").contains("not valid UTF-8");
        assertThat(r.err().lines().filter(l -> l.contains("not valid UTF-8")).count()).isEqualTo(1);
        assertThat(r.out()).contains("read " + (LINES - 1) + " events (1 bad lines skipped");
        assertThat(journalRows(db)).isEqualTo(LINES - 1);
    }

    @Test
    void ingestOfStandardInputBehavesAsIngestOfTheFile() throws Exception {
        Path file = fileWithOneBadByte();
        String db = dir.resolve("pipe.db").toString();
        InputStream before = System.in;
        CliRun r;
        try (InputStream in = Files.newInputStream(file)) {
            System.setIn(in);
            r = CliRun.of("ingest", "-", "--playbooks", LIBRARY, "--fleet", FLEET, "--db", db);
        } finally {
            System.setIn(before);
        }
        assertThat(r.exit()).as(r.err()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.err()).contains("-:" + BAD_LINE + ":").contains("not valid UTF-8");
        assertThat(r.out()).contains("read " + (LINES - 1) + " events (1 bad lines skipped");
        assertThat(journalRows(db)).isEqualTo(LINES - 1);
    }

    @Test
    void ingestOfAMissingFileIsExitTwoNamingThePath() {
        Path missing = dir.resolve("nowhere.jsonl");
        CliRun r = CliRun.of("ingest", missing.toString(), "--playbooks", LIBRARY, "--fleet", FLEET,
                "--db", dir.resolve("m.db").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err().strip()).isEqualTo(missing + ": no such file");
    }

    @Test
    void replayRefusesTheLineThatIsNotUtf8ByNumberAndListsEveryBadLineInJson() throws Exception {
        Path file = fileWithOneBadByte();
        // 30 more bad lines: the JSON report lists all 31, the text the first 20
        StringBuilder more = new StringBuilder();
        for (int i = 0; i < 30; i++) more.append("{\"at\":\"yesterday\"}\n");
        Files.writeString(file, more.toString(), StandardCharsets.UTF_8, java.nio.file.StandardOpenOption.APPEND);
        CliRun json = CliRun.of("replay", file.toString(), "--playbooks", LIBRARY, "--fleet", FLEET, "--format", "json");
        assertThat(json.exit()).as(json.err()).isEqualTo(ExitCodes.FINDINGS);
        JsonNode rec = new ObjectMapper().readTree(json.out()).get("recording");
        assertThat(rec.get("events").asLong()).isEqualTo(LINES - 1);
        assertThat(rec.get("bad_lines").asLong()).isEqualTo(31);
        JsonNode problems = rec.get("bad_line_problems");
        assertThat(problems).hasSize(31);
        assertThat(problems.get(0).get("line").asInt()).isEqualTo(BAD_LINE);
        assertThat(problems.get(30).get("line").asInt()).isEqualTo(LINES + 30);

        CliRun text = CliRun.of("replay", file.toString(), "--playbooks", LIBRARY, "--fleet", FLEET);
        assertThat(text.out()).contains("skipped " + file + ":" + BAD_LINE + ":").contains("... and 11 more bad lines");
    }

    @Test
    void replayOfALineDatedInTheYear9999RefusesThatLineByNumberWithoutATrace() throws Exception {
        Path file = dir.resolve("far-future.jsonl");
        Files.writeString(file, """
                {"at":"2027-03-14T02:00:00Z","cluster":"fares-3","node":"n1","signal":"heartbeat","state":"silent"}
                {"at":"9999-12-31T23:59:59Z","cluster":"fares-3","node":"n2","signal":"heartbeat","state":"silent"}
                {"at":"2027-03-14T02:01:00Z","cluster":"fares-3","node":"n1","signal":"heartbeat","state":"clear"}
                """, StandardCharsets.UTF_8);
        CliRun r = CliRun.of("replay", file.toString(), "--playbooks", LIBRARY, "--fleet", FLEET, "--format", "json");
        assertThat(r.exit()).as(r.err()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.err()).doesNotContain("\tat ").doesNotContain("Exception");
        JsonNode rec = new ObjectMapper().readTree(r.out()).get("recording");
        assertThat(rec.get("events").asLong()).isEqualTo(2);
        assertThat(rec.get("bad_line_problems")).singleElement().satisfies(p -> {
            assertThat(p.get("line").asInt()).isEqualTo(2);
            assertThat(p.get("message").asText()).contains("after 2200");
        });
    }
}
