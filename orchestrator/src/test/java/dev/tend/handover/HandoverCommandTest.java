package dev.tend.handover;

import dev.tend.cli.TendMain;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;

import static dev.tend.handover.NightShift.SINCE;
import static dev.tend.handover.NightShift.UNTIL;
import static org.assertj.core.api.Assertions.assertThat;

/** {@code tend handover} on a store the real engine wrote (read only: one night serves every test). */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class HandoverCommandTest {
    private Path dir;
    private Path db;
    private StringWriter out;
    private StringWriter err;

    @BeforeAll
    void playTheNight(@TempDir Path tmp) throws Exception {
        dir = tmp;
        db = dir.resolve("tend.db");
        NightShift.overnight(db).close();
    }

    @BeforeEach
    void freshStreams() {
        out = new StringWriter();
        err = new StringWriter();
    }

    private int tend(String... args) {
        return TendMain.run(args, new PrintWriter(out), new PrintWriter(err));
    }

    @Test
    void printsTheTextReportByDefault() {
        int code = tend("handover", "--since", SINCE.toString(), "--until", UNTIL.toString(), "--db", db.toString());

        assertThat(code).as(err.toString()).isZero();
        assertThat(out.toString()).startsWith("Handover 2027-03-13T22:00:00Z to 2027-03-14T06:00:00Z (8h)")
                .contains("4 started, 2 succeeded, 1 failed", "verify ok");
    }

    @Test
    void writesCsvAndHtmlToTheFileGiven() throws Exception {
        Path csv = dir.resolve("night.csv");
        Path summary = dir.resolve("night-summary.csv");
        Path html = dir.resolve("out/night.html");

        assertThat(tend("handover", "--since", SINCE.toString(), "--until", UNTIL.toString(), "--db", db.toString(),
                "--format", "csv", "--out", csv.toString())).as(err.toString()).isZero();
        assertThat(tend("handover", "--since", SINCE.toString(), "--until", UNTIL.toString(), "--db", db.toString(),
                "--format", "csv", "--table", "summary", "--out", summary.toString())).as(err.toString()).isZero();
        assertThat(tend("handover", "--since", SINCE.toString(), "--until", UNTIL.toString(), "--db", db.toString(),
                "--format", "html", "--out", html.toString())).as(err.toString()).isZero();

        assertThat(out.toString()).isEmpty();
        // one table per file (RFC 4180 section 2: one header line, then records of the same fields)
        assertThat(Files.readString(csv)).startsWith("run,playbook,cluster,node,").doesNotContain("\r\n\r\n")
                .doesNotContain("metric,playbook,reason_code,value");
        assertThat(Files.readString(summary)).startsWith("metric,playbook,reason_code,value\r\n").contains("runs_started,,,4\r\n")
                .doesNotContain("run,playbook,cluster,node,");
        assertThat(Files.readString(html)).startsWith("<!DOCTYPE html>").contains("<svg class=\"timeline\"");
    }

    @Test
    void untilNotAfterSinceIsAUsageError() {
        int code = tend("handover", "--since", UNTIL.toString(), "--until", SINCE.toString(), "--db", db.toString());

        assertThat(code).isEqualTo(2);
        assertThat(err.toString()).contains("--until (2027-03-13T22:00:00Z) must be after --since (2027-03-14T06:00:00Z)");
    }

    @Test
    void sinceIsRequired() {
        assertThat(tend("handover", "--db", db.toString())).isEqualTo(2);
        assertThat(err.toString()).contains("--since");
    }

    @Test
    void aTimeThatIsNoTimeIsAUsageError() {
        assertThat(tend("handover", "--since", "yesterday-ish", "--db", db.toString())).isEqualTo(2);
        assertThat(err.toString()).contains("'yesterday-ish' is not a time");
    }

    @Test
    void aMissingStoreIsAUsageError() {
        assertThat(tend("handover", "--since", "8h", "--db", dir.resolve("nowhere.db").toString())).isEqualTo(2);
        assertThat(err.toString()).contains("nowhere.db: no such store");
    }
}
