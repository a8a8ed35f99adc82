package dev.tend.store.internal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;

import static org.junit.jupiter.api.Assertions.assertEquals;

class WalCheckpointerTest {
    @TempDir
    Path dir;

    @Test
    void theWriterLeavesTheLogToTheCheckpointerWhichCopiesItAfterACommit() throws Exception {
        Path file = dir.resolve("wal.db");
        try (Database db = Database.sqlite(file)) {
            int autocheckpoint = db.writeJdbi().withHandle(h -> h.createQuery("PRAGMA wal_autocheckpoint").mapTo(Integer.class).one());
            assertEquals(0, autocheckpoint, "no checkpoint inside a commit");
            db.writeJdbi().useTransaction(h -> h.execute("UPDATE ledger_head SET seq = 3 WHERE id = 1"));
            db.committed();
            // the database file alone (a copy without the log) shows what was copied into it; the
            // checkpointer's thread copies it soon after the commit (a bounded wait, not a timing figure)
            long deadline = System.nanoTime() + 30_000_000_000L;
            long seq;
            do {
                Thread.sleep(20);
                seq = headSeqInTheFileAlone(file);
            } while (seq != 3 && System.nanoTime() < deadline);
            assertEquals(3, seq, "the commit was copied from the log into the database file");
        }
    }

    @Test
    void askedToCopyNowItDoesNotWaitForTheIntervalAfterItsLastCheckpoint() throws Exception {
        Path file = dir.resolve("soon.db");
        String url = "jdbc:sqlite:" + file;
        try (Connection writer = DriverManager.getConnection(url); Statement w = writer.createStatement()) {
            w.execute("PRAGMA journal_mode = WAL");
            w.execute("PRAGMA wal_autocheckpoint = 0");
            w.execute("CREATE TABLE ledger_head (id INTEGER PRIMARY KEY, seq INTEGER)");
            w.execute("INSERT INTO ledger_head VALUES (1, 1)");
            org.sqlite.SQLiteDataSource source = new org.sqlite.SQLiteDataSource();
            source.setUrl(url);
            // an interval of an hour: only now() can bring the second checkpoint within this test
            try (WalCheckpointer checkpointer = new WalCheckpointer(source, file, 3_600_000L)) {
                checkpointer.committed(); // the first commit is copied at once
                awaitHeadSeqInTheFileAlone(file, 1);
                w.execute("UPDATE ledger_head SET seq = 2 WHERE id = 1");
                checkpointer.committed();
                Thread.sleep(300);
                assertEquals(1, headSeqInTheFileAlone(file), "within the hour after a checkpoint, the next waits");
                checkpointer.now();
                awaitHeadSeqInTheFileAlone(file, 2);
            }
        }
    }

    /** Waits up to 30 s (a bound on a wait, not a timing figure) for the database file alone to show {@code seq}. */
    private void awaitHeadSeqInTheFileAlone(Path file, long seq) throws Exception {
        long deadline = System.nanoTime() + 30_000_000_000L;
        long now;
        do {
            Thread.sleep(20);
            now = headSeqInTheFileAlone(file);
        } while (now != seq && System.nanoTime() < deadline);
        assertEquals(seq, now, "copied from the log into the database file");
    }

    private long headSeqInTheFileAlone(Path file) throws Exception {
        Path copy = dir.resolve("copy-" + System.nanoTime() + ".db");
        java.nio.file.Files.copy(file, copy);
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + copy); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT seq FROM ledger_head WHERE id = 1")) {
            rs.next();
            return rs.getLong(1);
        }
    }
}
