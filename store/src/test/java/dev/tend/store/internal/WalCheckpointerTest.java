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
