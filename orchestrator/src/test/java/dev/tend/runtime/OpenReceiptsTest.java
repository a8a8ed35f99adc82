package dev.tend.runtime;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.Input;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.time.VirtualClock;
import dev.tend.store.LedgerDraft;
import dev.tend.store.LedgerFilter;
import dev.tend.store.OpenReceipt;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Receipts of requests: counted in their caller's open receipt by the commit of their events,
 * in the ledger once they have been open a second on the driver's clock, and never lost: a
 * driver that starts closes what one that crashed left open.
 */
class OpenReceiptsTest {
    private static final Instant T = Instant.parse("2027-03-14T02:00:00Z");
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    private static LedgerDraft receipt(String by) {
        return new LedgerDraft(T, "transitions-received", Map.of("by", by, "from", "10.4.0.7", "accepted", 1, "rejected", 0,
                "requests", 1));
    }

    private static Input transition(int second, SignalState state) {
        return new Input.Transition(HealthTransition.of(T.plusSeconds(second), "fares-1", "n1", "heartbeat", state));
    }

    private static List<JsonNode> receipts(Store store) {
        List<JsonNode> out = new ArrayList<>();
        store.read(r -> {
            r.forEachLedger(LedgerFilter.all(), e -> {
                if (!e.kind().equals("transitions-received")) return;
                try {
                    out.add(JSON.readTree(e.entry()));
                } catch (java.io.IOException x) {
                    throw new AssertionError(x);
                }
            });
            return null;
        });
        return out;
    }

    private long openRows() throws Exception {
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + dir.resolve("tend.db")); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT COUNT(*) FROM open_receipts")) {
            rs.next();
            return rs.getLong(1);
        }
    }

    private static void await(String what, java.util.function.BooleanSupplier condition) throws InterruptedException {
        long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) throw new AssertionError("timed out waiting until " + what);
            Thread.sleep(10);
        }
    }

    /** An orchestrator on {@code store}, recovered, whose driver runs on a thread of its own until {@link #stop}. */
    private final class Running {
        final Orchestrator orch;
        private final Thread driver;
        private final java.util.concurrent.atomic.AtomicReference<RuntimeException> failure = new java.util.concurrent.atomic.AtomicReference<>();

        Running(Store store, VirtualClock clock, QuartzTimers quartz, dev.tend.executor.SimulatedExecutor sim) throws Exception {
            orch = new Orchestrator(store, FixHeartbeatFixture.setup(dir), Map.of("simulated", sim), quartz, n -> { }, clock);
            quartz.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            orch.recover();
            driver = new Thread(() -> {
                try {
                    orch.runUntil(() -> false);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                } catch (RuntimeException e) {
                    failure.set(e);
                }
            }, "test-driver");
            driver.start();
        }

        /** Stops the driver (a clean stop) and checks that it did not fail. */
        void stop() throws InterruptedException {
            orch.stop();
            driver.join();
            assertThat(failure.get()).as("the driver's failure").isNull();
        }
    }

    @Test
    void receiptsStayOpenUntilASecondHasPassedThenBecomeOneEntryPerCaller() throws Exception {
        VirtualClock clock = VirtualClock.at(T);
        try (Store store = Store.openSqlite(dir.resolve("tend.db")); QuartzTimers quartz = new QuartzTimers();
             dev.tend.executor.SimulatedExecutor sim = new dev.tend.executor.SimulatedExecutor(1, 100)) {
            Running running = new Running(store, clock, quartz, sim);
            Orchestrator orch = running.orch;
            // a starting driver closes whatever a crash may have left open, at once: nothing here
            orch.submitEventAndWait(transition(0, SignalState.SILENT)).get();

            orch.submitEventAndWait(transition(1, SignalState.CLEAR), receipt("olga")).get();
            orch.submitEventAndWait(transition(2, SignalState.SILENT), receipt("otto")).get();
            orch.submitEventAndWait(transition(3, SignalState.CLEAR), receipt("olga")).get();
            assertThat(receipts(store)).as("committed with their events, open in the store").isEmpty();
            assertThat(openRows()).isEqualTo(2);

            clock.advance(Duration.ofMillis(999));
            orch.submitEventAndWait(transition(4, SignalState.SILENT)).get(); // a commit before the second is up
            assertThat(receipts(store)).isEmpty();

            clock.advance(Duration.ofMillis(1));
            await("the idle driver closed the receipts", () -> receipts(store).size() == 2);
            List<JsonNode> closed = receipts(store);
            assertThat(closed).extracting(e -> e.get("by").asText()).containsExactly("olga", "otto");
            assertThat(closed.get(0).get("requests").asLong()).isEqualTo(2);
            assertThat(closed.get(0).get("accepted").asLong()).isEqualTo(2);
            assertThat(closed.get(0).get("from").asText()).isEqualTo("10.4.0.7");
            assertThat(closed.get(1).get("requests").asLong()).isEqualTo(1);
            assertThat(closed.get(0).get("at").asText()).as("stamped at the caller's last request").isEqualTo("2027-03-14T02:00:00Z");
            assertThat(openRows()).isZero();

            orch.submitEventAndWait(transition(5, SignalState.CLEAR), receipt("otto")).get();
            running.stop();
            assertThat(receipts(store)).as("a clean stop closes what is open").hasSize(3);
            assertThat(store.read(r -> r.verifyLedger()).ok()).isTrue();
        }
    }

    @Test
    void receiptsACrashLeftOpenAreInTheLedgerOnceTheNextDriverStarts() throws Exception {
        Instant first = T.minusSeconds(30);
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            // what a driver that crashed left: counted with events it committed, never closed
            store.useTransaction(tx -> tx.addToOpenReceipts(List.of(new OpenReceipt("transitions-received",
                    "{\"by\":\"olga\",\"from\":\"10.4.0.7\"}", 40, 2, 21, first, first.plusMillis(900)))));
        }
        VirtualClock clock = VirtualClock.at(T);
        try (Store store = Store.openSqlite(dir.resolve("tend.db")); QuartzTimers quartz = new QuartzTimers();
             dev.tend.executor.SimulatedExecutor sim = new dev.tend.executor.SimulatedExecutor(1, 100)) {
            Running running = new Running(store, clock, quartz, sim);
            await("the started driver closed them", () -> receipts(store).size() == 1);
            running.stop();

            JsonNode e = receipts(store).get(0);
            assertThat(e.get("by").asText()).isEqualTo("olga");
            assertThat(e.get("accepted").asLong()).isEqualTo(40);
            assertThat(e.get("rejected").asLong()).isEqualTo(2);
            assertThat(e.get("requests").asLong()).isEqualTo(21);
            assertThat(e.get("at").asText()).isEqualTo("2027-03-14T01:59:30.900Z");
            assertThat(openRows()).isZero();
        }
    }
}
