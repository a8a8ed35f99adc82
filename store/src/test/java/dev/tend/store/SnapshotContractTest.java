package dev.tend.store;

import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** Snapshots kept beside the journal, and journal rows archived once a snapshot covers them. */
abstract class SnapshotContractTest extends StoreTestBase {
    private static SnapshotRow snapshot(long seq) {
        return new SnapshotRow(seq, T0.plusSeconds(seq), 1, "setup-a", ("{\"seq\":" + seq + "}").getBytes(StandardCharsets.UTF_8));
    }

    @Test
    void theNewestSnapshotIsReadBackByteForByteAndOnlyTheNewestAreKept() {
        assertThat(store.read(StoreReader::latestSnapshot)).isEmpty();
        for (long seq = 1; seq <= 4; seq++) {
            long s = seq;
            store.useTransaction(tx -> tx.putSnapshot(snapshot(s), 2));
        }
        SnapshotRow latest = store.read(StoreReader::latestSnapshot).orElseThrow();
        assertThat(latest.seq()).isEqualTo(4);
        assertThat(latest.takenAt()).isEqualTo(T0.plusSeconds(4));
        assertThat(latest.setup()).isEqualTo("setup-a");
        assertThat(new String(latest.body(), StandardCharsets.UTF_8)).isEqualTo("{\"seq\":4}");
        store.useTransaction(tx -> tx.putSnapshot(snapshot(4), 1));
        assertThat(store.read(StoreReader::latestSnapshot)).map(SnapshotRow::seq).contains(4L);
    }

    @Test
    void aStoreMigratedThroughThePageOutboxGainsTheSnapshotsTableWhenOpened() {
        // a store as a tend of version 2.16 left it: the page outbox but no snapshots table (nor the later lease
        // table and ledger indexes)
        store.close();
        store = null;
        db.execute("DROP TABLE snapshots");
        db.execute("DROP TABLE leader_lease");
        db.execute("DROP TABLE stream_offsets");
        db.execute("DROP INDEX ledger_kind");
        db.execute("DROP INDEX ledger_playbook");
        db.execute("DROP INDEX ledger_kind_time");
        // version 1's indexes by cluster and run held every entry
        db.execute("DROP INDEX ledger_cluster");
        db.execute("CREATE INDEX ledger_cluster ON ledger (cluster, seq)");
        db.execute("DROP INDEX ledger_run");
        db.execute("CREATE INDEX ledger_run ON ledger (run, seq)");
        // and its journal had an index by event time, not the table of hours
        db.execute("DROP TABLE journal_event_hours");
        db.execute("DROP TABLE open_receipts");
        db.execute("CREATE INDEX input_journal_recording ON input_journal (event_at_ns) WHERE kind IN ('transition', 'topology')");
        assertThat(db.execute("DELETE FROM flyway_schema_history WHERE version IN (?, ?, ?, ?, ?, ?, ?, ?, ?)", "2.17", "2.18", "2.19",
                "2.20", "2.21", "2.22", "2.23", "2.24", "2.25")).isEqualTo(9);
        assertThat(db.queryText("SELECT COUNT(*) FROM flyway_schema_history WHERE version = ?", "2.16")).isEqualTo("1");
        store = db.open();
        assertThat(db.queryText("SELECT COUNT(*) FROM flyway_schema_history WHERE version IN (?, ?, ?, ?, ?, ?, ?, ?, ?) AND success = ?",
                "2.17", "2.18", "2.19", "2.20", "2.21", "2.22", "2.23", "2.24", "2.25", true)).isEqualTo("9");
        store.useTransaction(tx -> tx.putSnapshot(snapshot(7), 1));
        assertThat(store.read(StoreReader::latestSnapshot)).map(SnapshotRow::seq).contains(7L);
    }

    @Test
    void deletingInputsKeepsTheNewestRowSoSeqsGoOnAndNeverTouchesTheLedger() {
        store.useTransaction(tx -> {
            List<InputRow> rows = new ArrayList<>();
            for (int i = 1; i <= 10; i++) rows.add(TransactionContractTest.input(i));
            tx.appendInputs(rows);
            tx.appendLedger(T0, "verdict", Map.of("cluster", "fares-3"));
        });
        // rows 1..10 were taken at T0+1s .. T0+10s: before T0+6s means rows 1..5; through seq 8 does not limit them
        long deleted = store.inTransaction(tx -> tx.deleteInputs(8, T0.plusSeconds(6)));
        assertThat(deleted).isEqualTo(5);
        long first = store.read(StoreReader::firstInputSeq);
        assertThat(first).isEqualTo(6);
        // everything before the end of time, through seq 10: the newest row stays
        long more = store.inTransaction(tx -> tx.deleteInputs(10, T0.plusSeconds(3600)));
        assertThat(more).isEqualTo(4);
        long firstAfter = store.read(StoreReader::firstInputSeq);
        assertThat(firstAfter).isEqualTo(10);
        long next = store.inTransaction(tx -> tx.appendInput(TransactionContractTest.input(11)));
        assertThat(next).isEqualTo(11);
        assertThat(store.read(StoreReader::verifyLedger).ok()).isTrue();
        long head = store.read(r -> r.ledgerHead().orElseThrow().seq());
        assertThat(head).isEqualTo(1);
    }
}
