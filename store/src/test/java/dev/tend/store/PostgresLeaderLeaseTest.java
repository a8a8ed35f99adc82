package dev.tend.store;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.Map;
import java.util.OptionalLong;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * The leader lease and fencing on a real PostgreSQL: two stores on one database stand for
 * two tend instances. Skipped, with the reason, when no PostgreSQL server can be had.
 */
class PostgresLeaderLeaseTest {
    private static final Duration TTL = Duration.ofMillis(800);

    private PostgresTestDatabase db;
    private Store a;
    private Store b;

    @BeforeEach
    void open() {
        db = PostgresTestDatabase.create();
        a = db.open();
        b = db.open();
    }

    @AfterEach
    void close() {
        if (a != null) a.close();
        if (b != null) b.close();
        if (db != null) db.close();
    }

    @Test
    void oneInstanceHoldsTheLeaseUntilItLapsesThenTheEpochRises() throws Exception {
        assertThat(a.lease().read()).isEmpty();
        OptionalLong first = a.lease().acquire("tend-a", "http://127.0.0.1:7421", TTL);
        assertThat(first).hasValue(1);
        assertThat(b.lease().acquire("tend-b", "http://127.0.0.1:7422", TTL)).isEmpty();
        LeaseRow held = b.lease().read().orElseThrow();
        assertThat(held.holder()).isEqualTo("tend-a");
        assertThat(held.address()).isEqualTo("http://127.0.0.1:7421");
        assertThat(held.lapsed()).isFalse();
        // renewing keeps it: b still cannot take it after more than one TTL
        for (int i = 0; i < 4; i++) {
            Thread.sleep(TTL.toMillis() / 2);
            assertThat(a.lease().renew(1, TTL)).isTrue();
        }
        assertThat(b.lease().acquire("tend-b", "http://127.0.0.1:7422", TTL)).isEmpty();
        Thread.sleep(TTL.toMillis() + 200);
        assertThat(b.lease().acquire("tend-b", "http://127.0.0.1:7422", TTL)).hasValue(2);
        assertThat(a.lease().renew(1, TTL)).as("a deposed leader cannot renew").isFalse();
        // a clean stop lets it lapse at once
        b.lease().release(2);
        assertThat(a.lease().acquire("tend-a", "http://127.0.0.1:7421", TTL)).hasValue(3);
    }

    @Test
    void aLeaderThatLostItsLeaseCannotCommitAndNothingOfTheCommitIsWritten() throws Exception {
        long epoch = a.lease().acquire("tend-a", "http://127.0.0.1:7421", TTL).orElseThrow();
        a.fence(epoch);
        a.useTransaction(tx -> tx.appendLedger(StoreTestBase.T0, "verdict", Map.of("cluster", "fares-3")));
        // a stops renewing (paused); once the lease lapsed, b takes over
        Thread.sleep(TTL.toMillis() + 200);
        long next = b.lease().acquire("tend-b", "http://127.0.0.1:7422", TTL).orElseThrow();
        b.fence(next);
        assertThatThrownBy(() -> a.useTransaction(tx -> {
            tx.appendInput(TransactionContractTest.input(1));
            tx.appendLedger(StoreTestBase.T0.plusSeconds(1), "verdict", Map.of("cluster", "fares-4"));
        })).isInstanceOf(LeaseLostException.class)
                .hasMessageContaining("led under epoch 1")
                .hasMessageContaining("epoch 2 is held by tend-b at http://127.0.0.1:7422")
                .hasMessageContaining("nothing of it was written")
                .hasMessageContaining("stops leading");
        long lastInput = b.read(StoreReader::lastInputSeq);
        assertThat(lastInput).isZero();
        long headAfterRefusal = b.read(r -> r.ledgerHead().orElseThrow().seq());
        assertThat(headAfterRefusal).isEqualTo(1);
        // the new leader commits under its own epoch
        b.useTransaction(tx -> tx.appendLedger(StoreTestBase.T0.plusSeconds(2), "verdict", Map.of("cluster", "fares-5")));
        long head = a.read(r -> r.ledgerHead().orElseThrow().seq());
        assertThat(head).isEqualTo(2);
        boolean ok = a.read(StoreReader::verifyLedger).ok();
        assertThat(ok).isTrue();
    }

    @Test
    void aSqliteStoreHasNoLease(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir) {
        try (Store s = Store.openSqlite(dir.resolve("tend.db"))) {
            assertThatThrownBy(s::lease).isInstanceOf(StoreException.class).hasMessageContaining("a leader lease needs PostgreSQL");
        }
    }
}
