package dev.tend.store;

import dev.tend.shared.ApprovalState;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;

import java.time.Instant;
import java.util.List;
import java.util.Optional;

/**
 * A fresh database and an open Store on it for each test, and typed one-line reads (a
 * generic {@code store.read(...)} inside an overloaded {@code assertThat} cannot be inferred).
 */
abstract class StoreTestBase {
    static final Instant T0 = Instant.parse("2027-03-14T02:17:00Z");

    TestDatabase db;
    Store store;

    abstract TestDatabase createDatabase();

    @BeforeEach
    void openStore() {
        db = createDatabase();
        store = db.open();
    }

    @AfterEach
    void closeStore() {
        if (store != null) store.close();
        if (db != null) db.close();
    }

    List<RunRow> runs(RunFilter filter) {
        return store.read(r -> r.runs(filter));
    }

    Optional<RunRow> run(String id) {
        return store.read(r -> r.run(id));
    }

    List<StepRow> steps(String runId) {
        return store.read(r -> r.steps(runId));
    }

    List<TimerRow> timers() {
        return store.read(StoreReader::timers);
    }

    List<ExclusionRow> exclusions() {
        return store.read(StoreReader::exclusions);
    }

    List<ApprovalRow> approvals(ApprovalState state) {
        return store.read(r -> r.approvals(state));
    }

    Optional<String> state(String key) {
        return store.read(r -> r.state(key));
    }

    long lastInputSeq() {
        return store.read(StoreReader::lastInputSeq);
    }

    Optional<LedgerEntry> ledgerHead() {
        return store.read(StoreReader::ledgerHead);
    }

    LedgerVerification verify() {
        return store.read(StoreReader::verifyLedger);
    }

    boolean cancelTimer(String key) {
        return store.inTransaction(tx -> tx.cancelTimer(key));
    }

    boolean removeExclusion(String cluster, String node) {
        return store.inTransaction(tx -> tx.removeExclusion(cluster, node));
    }

    boolean deleteState(String key) {
        return store.inTransaction(tx -> tx.deleteState(key));
    }
}
