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
 * read as due while its attempt is being recorded is not sent again.
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
}
