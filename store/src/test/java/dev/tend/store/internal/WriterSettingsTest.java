package dev.tend.store.internal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class WriterSettingsTest {
    @TempDir
    Path dir;

    @Test
    void theWriterKeepsItsStatementJournalsInMemoryAndTheReadersKeepSqlitesDefault() {
        try (Database db = Database.sqlite(dir.resolve("settings.db"))) {
            // PRAGMA temp_store: 0 default (a file, as compiled), 1 file, 2 memory (SQLite's documentation of the pragma)
            int writer = db.writeJdbi().withHandle(h -> h.createQuery("PRAGMA temp_store").mapTo(Integer.class).one());
            int reader = db.readJdbi().withHandle(h -> h.createQuery("PRAGMA temp_store").mapTo(Integer.class).one());
            assertEquals(2, writer, "a multi-row insert's statement journal must not spill to a temporary file");
            assertEquals(0, reader, "a reader's large sort may still spill to a file instead of growing in memory");
        }
    }

    @Test
    void everyConnectionCutsTheLogBackTo64MegabytesWhenItStartsOver() {
        try (Database db = Database.sqlite(dir.resolve("limit.db"))) {
            // PRAGMA journal_size_limit: the bytes a log file is truncated to after it is reset (SQLite's documentation of the pragma)
            long writer = db.writeJdbi().withHandle(h -> h.createQuery("PRAGMA journal_size_limit").mapTo(Long.class).one());
            long reader = db.readJdbi().withHandle(h -> h.createQuery("PRAGMA journal_size_limit").mapTo(Long.class).one());
            assertEquals(64L << 20, writer);
            assertEquals(64L << 20, reader, "the last connection to close is often a reader's");
        }
    }

    @Test
    void aMultiRowInsertThatFailsPartWayStillUndoesItsEarlierRows() {
        try (Database db = Database.sqlite(dir.resolve("undo.db"))) {
            db.writeJdbi().useHandle(h -> {
                h.execute("CREATE TABLE t (k INTEGER PRIMARY KEY, v TEXT NOT NULL)");
                h.begin();
                h.execute("INSERT INTO t (k, v) VALUES (1, 'kept')");
                // the third row breaks NOT NULL: the statement's first two rows are undone from the in-memory journal
                assertTrue(failed(() -> h.execute("INSERT INTO t (k, v) VALUES (2, 'a'), (3, 'b'), (4, NULL)")));
                h.commit();
                assertEquals(1, h.createQuery("SELECT COUNT(*) FROM t").mapTo(Integer.class).one());
            });
        }
    }

    private static boolean failed(Runnable r) {
        try {
            r.run();
            return false;
        } catch (RuntimeException expected) {
            return true;
        }
    }
}
