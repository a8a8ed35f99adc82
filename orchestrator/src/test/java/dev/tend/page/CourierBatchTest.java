package dev.tend.page;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.http.OutgoingHttp;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.function.Function;
import java.util.stream.Collectors;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The courier records the attempts of pages sent together in shared transactions, and a page
 * read as due while its attempt is being recorded is not sent again; an attempt made while a
 * slow send of the same claim is still out is recorded without waiting for it.
 */
class CourierBatchTest {
    @TempDir
    Path dir;

    @Test
    void manyPagesWokenForAgainAndAgainGoOutOnceEachWithOneDeliveredEntryEach() throws Exception {
        StringWriter log = new StringWriter();
        Senders senders = Senders.from(Outboxes.paging("channels:\n  oncall:\n    log: {}\n"), new OutgoingHttp(), new PrintWriter(log, true));
        int pages = 300;
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            Courier courier = new Courier(store, senders, Clock.systemUTC(), Duration.ofSeconds(5), Courier.Listener.NONE).start();
            try {
                for (int i = 0; i < pages; i++) {
                    Outboxes.enqueue(store, "brake/" + i, "oncall", "brake", "fares-" + (i % 7), "fleet brake engaged number " + i + ".");
                    courier.wake(); // each page wakes the courier while earlier ones are still being sent and recorded
                }
                Outboxes.await("every page delivered", Duration.ofSeconds(60), () -> {
                    for (int i = 0; i < pages; i++) if (!Outboxes.row(store, "brake/" + i).state().equals(PageRow.DELIVERED)) return false;
                    return true;
                });
            } finally {
                courier.close();
            }
            List<JsonNode> delivered = Outboxes.ledger(store, "notification-delivered");
            Map<String, Long> perPage = delivered.stream().collect(Collectors.groupingBy(e -> e.get("id").asText(), Collectors.counting()));
            assertThat(perPage).hasSize(pages);
            assertThat(perPage.values()).allMatch(n -> n == 1L);
            assertThat(store.read(StoreReader::verifyLedger).ok()).as("the ledger's chain holds").isTrue();
        }
        Map<String, Long> sent = log.toString().lines().filter(l -> l.contains("fleet brake engaged number"))
                .collect(Collectors.groupingBy(Function.identity(), Collectors.counting()));
        assertThat(sent).hasSize(pages);
        assertThat(sent.values()).as("no page went out twice").allMatch(n -> n == 1L);
    }

    @Test
    void aPageAnsweredWhileASlowSendIsStillOutIsRecordedBeforeThatSendEnds() throws Exception {
        StringWriter log = new StringWriter();
        // the slow channel's command takes 6 s; the courier claims both pages in one round
        Senders senders = Senders.from(Outboxes.paging("""
                channels:
                  slow:
                    command: [/bin/sleep, "6"]
                  oncall:
                    log: {}
                """), new OutgoingHttp(), new PrintWriter(log, true));
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            Outboxes.enqueue(store, "brake/slow", "slow", "brake", "fares-3", "fleet brake engaged (slow channel)");
            Outboxes.enqueue(store, "brake/fast", "oncall", "brake", "fares-3", "fleet brake engaged (log)");
            Courier courier = new Courier(store, senders, Clock.systemUTC(), Duration.ofSeconds(5), Courier.Listener.NONE).start();
            try {
                courier.wake();
                Outboxes.await("the log page recorded", Duration.ofSeconds(30),
                        () -> Outboxes.row(store, "brake/fast").state().equals(PageRow.DELIVERED));
                // recorded alone: had it waited for the slow send, the two would have been recorded together
                assertThat(Outboxes.row(store, "brake/slow").state()).as("the slow send is still out").isEqualTo(PageRow.PENDING);
                Outboxes.await("the slow page recorded", Duration.ofSeconds(20),
                        () -> Outboxes.row(store, "brake/slow").state().equals(PageRow.DELIVERED));
            } finally {
                courier.close();
            }
            assertThat(Outboxes.ledger(store, "notification-delivered")).hasSize(2);
            assertThat(store.read(StoreReader::verifyLedger).ok()).as("the ledger's chain holds").isTrue();
        }
    }
}
