package dev.tend.handover;

import dev.tend.cli.TendMain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;

import static dev.tend.handover.NightShift.SINCE;
import static dev.tend.handover.NightShift.UNTIL;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * A ledger edited after it was written: the report still comes out, says first that verify
 * failed and where, and {@code tend handover} exits 1. The edit is the one hand-made change
 * to a ledger the real engine wrote.
 */
class HandoverTamperedLedgerTest {
    @TempDir
    Path dir;

    @Test
    void reportShowsVerifyFailedAtTheEditedEntry() throws Exception {
        Path db = playAndClose();
        long seq = edit(db, "UPDATE ledger SET entry = replace(entry, '\"fares-3\"', '\"fares-8\"') WHERE seq = ?",
                "SELECT min(seq) FROM ledger WHERE kind = 'run-started' AND cluster = 'fares-3'");

        try (dev.tend.store.Store store = dev.tend.store.Store.openSqlite(db)) {
            HandoverReport r = store.read(x -> HandoverReport.from(x, ReportPeriod.of(SINCE, UNTIL)));

            assertThat(r.ledger().verified()).isFalse();
            assertThat(r.ledger().firstBrokenSeq()).isEqualTo(seq);
            assertThat(r.needsAttention()).isTrue();
            String text = HandoverText.render(r);
            assertThat(text).contains("verify FAILED at entry " + seq);
            assertThat(text.indexOf("! ledger verify failed")).isPositive().isLessThan(text.indexOf("! approval pending"));
            assertThat(HandoverHtml.render(r)).contains("<strong>Ledger verify failed</strong> at entry " + seq);
            assertThat(HandoverCsv.render(r)).contains("ledger_verified,,,false\r\n", "ledger_first_broken_seq,,," + seq + "\r\n");
        }
    }

    @Test
    void anEntryThatIsNoLongerJsonIsLeftOutAndCounted() throws Exception {
        Path db = playAndClose();
        long seq = edit(db, "UPDATE ledger SET entry = '{broken' WHERE seq = ?",
                "SELECT min(seq) FROM ledger WHERE kind = 'run-ended' AND cluster = 'fares-2'");

        try (dev.tend.store.Store store = dev.tend.store.Store.openSqlite(db)) {
            HandoverReport r = store.read(x -> HandoverReport.from(x, ReportPeriod.of(SINCE, UNTIL)));

            assertThat(r.ledger().verified()).isFalse();
            assertThat(r.ledger().firstBrokenSeq()).isEqualTo(seq);
            assertThat(r.ledger().unreadable()).isEqualTo(1);
            assertThat(r.totals().succeeded()).as("fares-2's end is unreadable").isEqualTo(1);
            assertThat(HandoverText.render(r)).contains("! 1 entries of the period are not readable and were left out");
        }
    }

    @Test
    void anEntryWhoseHashColumnIsNoLongerAHashIsNamedAndTheRestStillCounted() throws Exception {
        Path db = playAndClose();
        HandoverReport clean;
        try (dev.tend.store.Store store = dev.tend.store.Store.openSqlite(db)) {
            clean = store.read(x -> HandoverReport.from(x, ReportPeriod.of(SINCE, UNTIL)));
        }
        long seq = edit(db, "UPDATE ledger SET hash = 'not a hash' WHERE seq = ?",
                "SELECT min(seq) FROM ledger WHERE kind = 'verdict' AND at_ns >= " + (SINCE.getEpochSecond() * 1_000_000_000L));

        try (dev.tend.store.Store store = dev.tend.store.Store.openSqlite(db)) {
            HandoverReport r = store.read(x -> HandoverReport.from(x, ReportPeriod.of(SINCE, UNTIL)));

            assertThat(r.ledger().verified()).isFalse();
            assertThat(r.ledger().firstBrokenSeq()).isEqualTo(seq);
            assertThat(r.ledger().verifyMessage()).contains("its hash does not match its content");
            assertThat(r.byPlaybook()).as("the tally reads on past the entry at fault").isEqualTo(clean.byPlaybook());
        }
    }

    @Test
    void handoverCommandWritesTheReportAndExitsOneWhenVerifyFails() throws Exception {
        Path db = playAndClose();
        edit(db, "UPDATE ledger SET entry = replace(entry, '\"ana\"', '\"eve\"') WHERE seq = ?",
                "SELECT min(seq) FROM ledger WHERE kind = 'brake-engaged'");
        Path out = dir.resolve("reports/handover.html");
        StringWriter stdout = new StringWriter();
        StringWriter stderr = new StringWriter();

        int code = TendMain.run(new String[]{"handover", "--since", SINCE.toString(), "--until", UNTIL.toString(), "--db",
                db.toString(), "--format", "html", "--out", out.toString()}, new PrintWriter(stdout), new PrintWriter(stderr));

        assertThat(code).isEqualTo(1);
        assertThat(stderr.toString()).contains("the ledger failed verify at entry");
        assertThat(Files.readString(out)).startsWith("<!DOCTYPE html>").contains("Ledger verify failed");
    }

    private Path playAndClose() throws InterruptedException {
        Path db = dir.resolve("tend.db");
        NightShift.overnight(db).close();
        return db;
    }

    /** Runs {@code update} on the entry {@code select} finds, behind the store's back; returns that entry's seq. */
    private static long edit(Path db, String update, String select) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db)) {
            long seq;
            try (ResultSet rs = c.createStatement().executeQuery(select)) {
                assertThat(rs.next()).isTrue();
                seq = rs.getLong(1);
            }
            assertThat(seq).isPositive();
            try (PreparedStatement ps = c.prepareStatement(update)) {
                ps.setLong(1, seq);
                assertThat(ps.executeUpdate()).isEqualTo(1);
            }
            return seq;
        }
    }
}
