package dev.tend.store.internal;

import dev.tend.store.InputRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** The journal rows of a transaction: numbered from the first, their times worked out once, written as given. */
class PendingInputsTest {
    private static final Instant NOW = Instant.parse("2027-03-14T09:00:00.123456789Z");
    private static final Instant EVENT = Instant.parse("2027-03-14T08:59:58Z");

    @TempDir
    Path dir;

    @Test
    void rowsAreNumberedFromTheFirstSeqWithTheirTimesInNanoseconds() {
        PendingInputs p = new PendingInputs();
        p.add(InputRow.of(InputRow.TRANSITION, NOW, EVENT, "fares-3", "{}"), 41);
        p.add(InputRow.of("timer", NOW, null, null, "{}"), 42);
        assertThat(p.size()).isEqualTo(2);
        assertThat(p.seq(0)).isEqualTo(41);
        assertThat(p.seq(1)).isEqualTo(42);
        // 2027-03-14T09:00:00Z is 1,805,014,800 s after 1970-01-01T00:00:00Z (computed independently with Python's datetime)
        assertThat(p.nowNanos(0)).isEqualTo(1_805_014_800_123_456_789L);
        assertThat(p.eventAtNanos(0)).isEqualTo(1_805_014_798_000_000_000L);
        p.clear();
        assertThat(p.isEmpty()).isTrue();
        p.add(InputRow.of("timer", NOW, null, null, "{}"), 7);
        assertThat(p.seq(0)).as("after clear the next row starts a new run").isEqualTo(7);
    }

    @Test
    void aRowThatCarriesASeqOrDoesNotFollowIsRefused() {
        PendingInputs p = new PendingInputs();
        assertThatThrownBy(() -> p.add(new InputRow(5, "timer", NOW, null, null, "{}"), 5))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("seq 0");
        p.add(InputRow.of("timer", NOW, null, null, "{}"), 1);
        assertThatThrownBy(() -> p.add(InputRow.of("timer", NOW, null, null, "{}"), 3))
                .isInstanceOf(IllegalStateException.class).hasMessageContaining("does not follow");
    }

    @Test
    void aTransactionOfManyRowsWritesEachWithItsSeqTimesAndText() throws Exception {
        Path db = dir.resolve("journal.db");
        int n = JdbiTx.BATCH * 2 + 7; // sent in three parts within the transaction
        List<InputRow> rows = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            rows.add(i % 3 == 0 ? InputRow.of("timer", NOW.plusNanos(i), null, null, "{\"i\":" + i + "}")
                    : InputRow.of(InputRow.TRANSITION, NOW.plusNanos(i), EVENT.plusSeconds(i), "dispatch-" + i % 5, "{\"i\":" + i + "}"));
        }
        long last;
        try (Store store = Store.openSqlite(db)) {
            store.useTransaction(tx -> tx.appendInput(InputRow.of("timer", NOW, null, null, "{}")));
            last = store.inTransaction(tx -> tx.appendInputs(rows));
        }
        assertThat(last).isEqualTo(n + 1);
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT seq, kind, now_ns, event_at_ns, cluster, payload FROM input_journal WHERE seq > 1 ORDER BY seq")) {
            int i = 0;
            while (rs.next()) {
                InputRow r = rows.get(i);
                assertThat(rs.getLong(1)).isEqualTo(i + 2);
                assertThat(rs.getString(2)).isEqualTo(r.kind());
                assertThat(rs.getLong(3)).isEqualTo(Times.nanos(r.now(), "now"));
                if (r.eventAt() == null) assertThat(rs.getObject(4)).isNull();
                else assertThat(rs.getLong(4)).isEqualTo(Times.nanos(r.eventAt(), "eventAt"));
                assertThat(rs.getString(5)).isEqualTo(r.cluster());
                assertThat(rs.getString(6)).isEqualTo(r.payload());
                i++;
            }
            assertThat(i).isEqualTo(n);
        }
    }
}
