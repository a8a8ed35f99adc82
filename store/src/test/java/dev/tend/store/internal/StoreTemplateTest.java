package dev.tend.store.internal;

import dev.tend.store.InputRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** A new store copied from this jar's empty one holds what the migrations make, and no existing file is ever replaced. */
class StoreTemplateTest {
    @TempDir
    Path dir;

    private static List<String> rows(Path db, String sql) throws Exception {
        List<String> out = new ArrayList<>();
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            int n = rs.getMetaData().getColumnCount();
            while (rs.next()) {
                StringBuilder row = new StringBuilder();
                for (int i = 1; i <= n; i++) row.append(rs.getString(i)).append(" | ");
                out.add(row.toString());
            }
        }
        return out;
    }

    @Test
    void aStoreCopiedFromTheTemplateHoldsTheSchemaAndHistoryTheMigrationsMake() throws Exception {
        Path kept = dir.resolve("kept");
        Path template = StoreTemplate.make(kept);
        assertThat(template).isRegularFile();
        assertThat(StoreTemplate.make(kept)).as("made once").isEqualTo(template);

        Path copied = dir.resolve("copied.db");
        assertThat(StoreTemplate.copyInto(kept, copied)).isTrue();
        Path migrated = dir.resolve("migrated.db");
        try (Store a = Store.openSqlite(copied); Store b = Store.openSqlite(migrated)) {
            a.useTransaction(tx -> tx.appendInput(InputRow.of("timer", Instant.parse("2027-03-14T09:00:00Z"), null, null, "{}")));
            b.useTransaction(tx -> tx.appendInput(InputRow.of("timer", Instant.parse("2027-03-14T09:00:00Z"), null, null, "{}")));
        }
        String schema = "SELECT type, name, tbl_name, sql FROM sqlite_master ORDER BY type, name";
        assertThat(rows(copied, schema)).isEqualTo(rows(migrated, schema));
        // Flyway's history, but for when and by whom: the template's scripts, checksums and outcomes
        String history = "SELECT installed_rank, version, description, type, script, checksum, success FROM "
                + Migrations.HISTORY_TABLE + " ORDER BY installed_rank";
        assertThat(rows(copied, history)).hasSize(Migrations.BUNDLED.size()).isEqualTo(rows(migrated, history));
        assertThat(rows(copied, "PRAGMA journal_mode")).containsExactly("wal | ");
        assertThat(rows(copied, "SELECT seq, kind FROM input_journal")).containsExactly("1 | timer | ");
        try (var left = Files.list(dir)) {
            assertThat(left.filter(p -> p.getFileName().toString().endsWith(".new")).toList()).as("no part file left").isEmpty();
        }
    }

    @Test
    void aFileAlreadyThereIsNeverReplaced() throws Exception {
        Path kept = dir.resolve("kept");
        StoreTemplate.make(kept);
        Path there = dir.resolve("there.db");
        Files.writeString(there, "not a store, and not ours to replace");
        assertThat(StoreTemplate.copyInto(kept, there)).isFalse();
        assertThat(Files.readString(there)).isEqualTo("not a store, and not ours to replace");

        Path withLog = dir.resolve("with-log.db");
        Files.writeString(withLog.resolveSibling("with-log.db-wal"), "a log whose store went missing");
        assertThat(StoreTemplate.copyInto(kept, withLog)).as("a log without its store is left for SQLite to judge").isFalse();
        assertThat(withLog).doesNotExist();
    }

    @Test
    void withoutATemplateNothingIsCopiedAndTheMigrationsMakeTheStore() throws Exception {
        Path empty = dir.resolve("nothing-kept");
        Path fresh = dir.resolve("fresh.db");
        assertThat(StoreTemplate.copyInto(empty, fresh)).isFalse();
        assertThat(fresh).doesNotExist();
        try (Store s = Store.openSqlite(fresh)) {
            long last = s.read(r -> r.lastInputSeq());
            assertThat(last).isZero();
        }
    }
}
