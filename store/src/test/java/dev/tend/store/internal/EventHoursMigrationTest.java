package dev.tend.store.internal;

import dev.tend.store.Store;
import org.flywaydb.core.Flyway;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.sqlite.SQLiteDataSource;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

class EventHoursMigrationTest {
    @TempDir
    Path dir;

    @Test
    void aStoreWrittenBeforeTheHoursTableFindsItsTransitionsByEventTimeAfterTheUpgrade() throws Exception {
        Path db = dir.resolve("older.db");
        SQLiteDataSource source = new SQLiteDataSource();
        source.setUrl("jdbc:sqlite:" + db);
        // the store as the version before V2_23 left it, with rows written then
        Flyway.configure(Migrations.class.getClassLoader()).dataSource(source).locations(Migrations.LOCATION)
                .table(Migrations.HISTORY_TABLE).placeholders(Dialect.SQLITE.placeholders()).target("2.22").load().migrate();
        long nine = Times.nanos(Instant.parse("2027-03-14T09:00:00Z"), "t");
        long hour = EventHours.NANOS_PER_HOUR;
        try (Connection c = source.getConnection(); Statement s = c.createStatement()) {
            s.execute("INSERT INTO input_journal (seq, kind, now_ns, event_at_ns, cluster, payload) VALUES"
                    + " (1, 'transition', 0, " + (nine + hour - 1) + ", 'fares-3', '{}'),"
                    + " (2, 'topology', 0, " + (nine + hour) + ", 'fares-3', '{}'),"
                    + " (3, 'timer', 0, " + (nine + 5) + ", 'fares-3', '{}'),"
                    + " (4, 'transition', 0, " + nine + ", 'dispatch-1', '{}'),"
                    + " (5, 'transition', 0, NULL, 'dispatch-1', '{}')");
        }

        try (Store store = Store.openSqlite(db)) {
            List<Long> seqs = new ArrayList<>();
            store.read(r -> {
                r.forEachTransitionInput(Instant.parse("2027-03-14T09:00:00Z"), Instant.parse("2027-03-14T10:00:00Z"), Set.of(),
                        row -> seqs.add(row.seq()));
                return null;
            });
            assertThat(seqs).containsExactly(1L, 4L);
        }
        try (Connection c = source.getConnection(); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT hour, first_seq, last_seq FROM journal_event_hours ORDER BY hour")) {
            List<List<Long>> hours = new ArrayList<>();
            while (rs.next()) hours.add(List.of(rs.getLong(1), rs.getLong(2), rs.getLong(3)));
            assertThat(hours).containsExactly(List.of(nine / hour, 1L, 4L), List.of(nine / hour + 1, 2L, 2L));
        }
    }

    @Test
    void anHourIsTheEventTimeDividedRoundingTowardsZeroAsSqlDoes() {
        assertThat(EventHours.of(0)).isZero();
        assertThat(EventHours.of(EventHours.NANOS_PER_HOUR - 1)).isZero();
        assertThat(EventHours.of(EventHours.NANOS_PER_HOUR)).isEqualTo(1);
        // SQL's integer division truncates (SQLite's and PostgreSQL's documentation; from memory), as Java's does
        assertThat(EventHours.of(-1)).isZero();
        assertThat(EventHours.of(-EventHours.NANOS_PER_HOUR)).isEqualTo(-1);
    }
}
