package dev.tend.store;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.Optional;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Opening SQLite files: creation, WAL mode, and the messages when it cannot be done. */
class SqliteStoreTest {
    @TempDir
    Path dir;

    @Test
    void openingCreatesTheFileAndItsFoldersInWalMode() {
        Path file = dir.resolve("larkspur/state/tend.db");
        try (Store store = Store.openSqlite(file)) {
            assertThat(file).isRegularFile();
            assertThat(store.location()).isEqualTo(file.toAbsolutePath().toString());
            assertThat(new SqliteTestDatabase(file).queryText("PRAGMA journal_mode")).isEqualTo("wal");
        }
    }

    @Test
    void aJdbcSqliteUrlOpensTheFile() {
        Path file = dir.resolve("tend.db");
        try (Store store = Store.openJdbc("jdbc:sqlite:" + file, null, null)) {
            store.useTransaction(tx -> tx.putState("brake", "{}"));
        }
        try (Store store = Store.openSqlite(file)) {
            Optional<String> brake = store.read(r -> r.state("brake"));
            assertThat(brake).contains("{}");
        }
    }

    @Test
    void aFolderIsRefusedWithAMessageSayingSo() {
        assertThatThrownBy(() -> Store.openSqlite(dir))
                .isInstanceOfSatisfying(StoreException.class, e -> assertThat(e.location()).isEqualTo(dir.toString()))
                .hasMessage("cannot open the store at " + dir + ": it is a folder; give the path of a file (it is created when missing)");
    }

    @Test
    void aFileThatIsNotADatabaseIsRefusedWithAMessageSayingWhatToDo() throws Exception {
        Path file = dir.resolve("notes.txt");
        Files.writeString(file, "fares-3 n2 replaced on Tuesday; ask ops-lena ".repeat(200));
        assertThatThrownBy(() -> Store.openSqlite(file))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot open the store at " + file + ": ")
                .hasMessageContaining("point tend at another file");
    }

    @Test
    void aSqliteDatabaseOfAnotherProgramIsRefusedAndLeftAlone() throws Exception {
        Path file = dir.resolve("other.db");
        SqliteTestDatabase other = new SqliteTestDatabase(file);
        other.execute("CREATE TABLE fares (id INTEGER PRIMARY KEY, amount INTEGER)");
        assertThatThrownBy(() -> Store.openSqlite(file))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot bring the store at " + file + " to this tend's schema: ")
                .hasMessageEndingWith("If the store was written by a newer tend, run that version; if it is not a tend store, "
                        + "point tend at another file or database.");
        assertThat(other.queryText("SELECT COUNT(*) FROM sqlite_master WHERE name = 'ledger'")).isEqualTo("0");
    }

    @Test
    void aStoreWrittenByANewerTendIsRefused() {
        Path file = dir.resolve("tend.db");
        Store.openSqlite(file).close();
        SqliteTestDatabase db = new SqliteTestDatabase(file);
        db.execute("INSERT INTO flyway_schema_history (installed_rank, version, description, type, script, checksum, "
                + "installed_by, execution_time, success) VALUES (99, '999', 'from a newer tend', 'SQL', 'V999__newer.sql', 0, 'tend', 1, 1)");
        assertThatThrownBy(() -> Store.openSqlite(file))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot bring the store at " + file + " to this tend's schema: ")
                .hasMessageContaining("If the store was written by a newer tend, run that version");
    }

    @Test
    void anUnknownKindOfUrlIsRefusedNamingTheTwoThatWork() {
        assertThatThrownBy(() -> Store.openJdbc("jdbc:mysql://db-1/tend?user=tend&password=hunter2", null, null))
                .isInstanceOfSatisfying(StoreException.class,
                        e -> assertThat(e.location()).isEqualTo("jdbc:mysql://db-1/tend?user=tend&password=***"))
                .hasMessage("cannot open the store at jdbc:mysql://db-1/tend?user=tend&password=***: tend stores live in a "
                        + "SQLite file (jdbc:sqlite:PATH or a file path) or in PostgreSQL (jdbc:postgresql://HOST:PORT/DATABASE)");
    }

    @Test
    void anUnreachablePostgresqlServerIsNamedWithoutItsPassword() {
        // Port 1 on the loopback address: nothing listens there.
        assertThatThrownBy(() -> Store.openJdbc("jdbc:postgresql://127.0.0.1:1/tend?password=hunter2&connectTimeout=2", "tend", null))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("cannot ")
                .hasMessageContaining("jdbc:postgresql://127.0.0.1:1/tend?password=***&connectTimeout=2")
                .hasMessageNotContaining("hunter2");
    }

    @Test
    void ledgerEntriesSurviveClosingAndReopening() {
        Path file = dir.resolve("tend.db");
        LedgerEntry first;
        try (Store store = Store.openSqlite(file)) {
            first = store.inTransaction(tx -> tx.appendLedger(ProjectionContractTest.T0, "verdict", Map.of("verdict", "deny")));
        }
        try (Store store = Store.openSqlite(file)) {
            LedgerEntry second = store.inTransaction(tx -> tx.appendLedger(ProjectionContractTest.T0, "verdict", Map.of()));
            assertThat(second.prevHash()).isEqualTo(first.hash());
            assertThat(store.read(StoreReader::verifyLedger).ok()).isTrue();
        }
    }

    @Test
    void aCommittedOrRolledBackWriteLeavesNoTransactionOpenForAnotherWriterToWaitOn() throws Exception {
        Path file = dir.resolve("tend.db");
        try (Store store = Store.openSqlite(file)) {
            store.useTransaction(tx -> tx.putState("brake", "{}"));
            assertThat(writesAtOnce(file, "fares-3")).isTrue();
            assertThatThrownBy(() -> store.useTransaction(tx -> {
                tx.putState("brake", "{\"engaged\":true}");
                throw new IllegalStateException("dispatch-1 went away");
            })).isInstanceOf(IllegalStateException.class);
            assertThat(writesAtOnce(file, "dispatch-1")).isTrue();
            store.useTransaction(tx -> tx.putState("loops", "{}"));
            assertThat(state(store, "brake")).contains("{}");
            assertThat(state(store, "loops")).contains("{}");
            assertThat(state(store, "other-fares-3")).contains("1");
            assertThat(state(store, "other-dispatch-1")).contains("1");
        }
    }

    private static Optional<String> state(Store store, String key) {
        return store.read(r -> r.state(key));
    }

    /** Whether a connection of its own writes to {@code file} without waiting for any lock (it throws SQLITE_BUSY if held). */
    private static boolean writesAtOnce(Path file, String cluster) throws Exception {
        try (java.sql.Connection c = new SqliteTestDatabase(file).connect(); java.sql.Statement s = c.createStatement()) {
            s.execute("PRAGMA busy_timeout = 0");
            s.execute("BEGIN IMMEDIATE");
            s.execute("INSERT INTO fleet_state (state_key, json) VALUES ('other-" + cluster + "', '1')");
            s.execute("COMMIT");
            return true;
        }
    }
}
