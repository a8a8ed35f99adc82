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
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

/** The hours of event time: an hour's greatest seq is kept rounded up, so small commits leave its row alone. */
class EventHoursTest {
    private static final Instant NINE = Instant.parse("2027-03-14T09:00:00Z");

    @TempDir
    Path dir;

    private long lastSeqOfNine(Path db) throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + db); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT last_seq FROM journal_event_hours WHERE hour = "
                     + EventHours.of(Times.nanos(NINE, "t")))) {
            return rs.next() ? rs.getLong(1) : -1;
        }
    }

    @Test
    void oneRowCommitsMoveTheirHoursLastSeqOncePerStepAndEveryRowIsStillFound() throws Exception {
        Path db = dir.resolve("hours.db");
        List<Long> recorded = new ArrayList<>();
        try (Store store = Store.openSqlite(db)) {
            for (int i = 0; i < EventHours.LAST_SEQ_STEP + 2; i++) {
                Instant at = NINE.plusMillis(i);
                store.useTransaction(tx -> tx.appendInput(InputRow.of(InputRow.TRANSITION, at, at, "fares-3", "{}")));
                recorded.add(lastSeqOfNine(db));
            }
            List<Long> seqs = new ArrayList<>();
            store.read(r -> {
                r.forEachTransitionInput(NINE, NINE.plusSeconds(3600), Set.of(), row -> seqs.add(row.seq()));
                return null;
            });
            assertThat(seqs).hasSize((int) EventHours.LAST_SEQ_STEP + 2).doesNotHaveDuplicates();
            assertThat(seqs.get(seqs.size() - 1)).isEqualTo(EventHours.LAST_SEQ_STEP + 2);
        }
        assertThat(recorded.subList(0, (int) EventHours.LAST_SEQ_STEP)).as("the first 1,024 rows: one value")
                .containsOnly(EventHours.LAST_SEQ_STEP);
        assertThat(recorded.subList((int) EventHours.LAST_SEQ_STEP, recorded.size())).containsOnly(2 * EventHours.LAST_SEQ_STEP);
    }
}
