package dev.tend.store.internal;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotSame;
import static org.junit.jupiter.api.Assertions.assertSame;

class HeadCacheTest {
    @TempDir
    Path dir;
    /** The store's kept statements: PRAGMA data_version runs on one kept prepared. */
    private final StatementCache statements = new StatementCache();

    @Test
    void theTailsReadOnceStayValidAcrossCheckoutsOfTheWriterConnection() {
        try (Database db = Database.sqlite(dir.resolve("heads.db"))) {
            HeadCache cache = new HeadCache(Dialect.SQLITE, db.location());
            Heads first = db.writeJdbi().inTransaction(h -> cache.claim(h, statements));
            cache.publish(first);
            // the pool wraps its one connection anew at every checkout: still the same connection
            Heads second = db.writeJdbi().inTransaction(h -> cache.claim(h, statements));
            assertSame(first, second, "no other connection committed, so the cached tails are used without a read");
        }
    }

    @Test
    void aCommitByAnotherConnectionMakesTheNextClaimReadTheTailsAgain() throws Exception {
        Path file = dir.resolve("heads.db");
        try (Database db = Database.sqlite(file)) {
            HeadCache cache = new HeadCache(Dialect.SQLITE, db.location());
            Heads first = db.writeJdbi().inTransaction(h -> cache.claim(h, statements));
            cache.publish(first);
            try (Connection other = DriverManager.getConnection("jdbc:sqlite:" + file); Statement s = other.createStatement()) {
                s.executeUpdate("UPDATE ledger_head SET seq = 7, hash = '" + "ab".repeat(32) + "' WHERE id = 1");
            }
            Heads again = db.writeJdbi().inTransaction(h -> cache.claim(h, statements));
            assertNotSame(first, again);
            assertEquals(7, again.ledgerSeq());
            assertEquals("ab".repeat(32), again.ledgerHash());
        }
    }
}
