package dev.tend.page;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.http.OutgoingHttp;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/** Pages through a webhook to a real HTTP receiver on loopback, from a real outbox in SQLite. */
class WebhookDeliveryTest {
    @TempDir
    Path dir;
    private Store store;
    private PageReceiver receiver;
    private Courier courier;
    private final Map<String, AtomicInteger> outcomes = new ConcurrentHashMap<>();

    @AfterEach
    void stop() {
        if (courier != null) courier.close();
        if (receiver != null) receiver.close();
        if (store != null) store.close();
    }

    private void start(String webhookKeys, Duration firstPause) {
        store = Store.openSqlite(dir.resolve("tend.db"));
        String yaml = """
                channels:
                  oncall:
                    webhook: { url: "%s", %s }
                """.formatted(receiver.url(), webhookKeys);
        Senders senders = Senders.from(Outboxes.paging(yaml).withConsoleUrl("https://tend.larkspur.example/"), new OutgoingHttp(),
                new PrintWriter(new StringWriter()));
        courier = new Courier(store, senders, Clock.systemUTC(), firstPause,
                (channel, outcome) -> outcomes.computeIfAbsent(channel + "/" + outcome, k -> new AtomicInteger()).incrementAndGet()).start();
    }

    @Test
    void everyPageIsDeliveredOnceByIdThroughFailuresAndSlowAnswersWithEveryTryLedgered() throws Exception {
        receiver = PageReceiver.http().failFirst(2).delay(Duration.ofMillis(200));
        start("retries: 3, backoff: 1s, timeout: 5s", Duration.ofSeconds(30));
        List<String> ids = List.of("brake/1", "r000007/page-owner", "r000009/needs-human");
        for (String id : ids) Outboxes.enqueue(store, id, "oncall", "brake", "fares-3", "fleet brake engaged: page " + id);
        courier.wake();

        Outboxes.await("three deliveries", Duration.ofSeconds(30),
                () -> ids.stream().allMatch(id -> Outboxes.row(store, id).state().equals(PageRow.DELIVERED)));

        assertThat(receiver.accepted()).containsOnlyKeys(ids).allSatisfy((k, n) -> assertThat(n).isEqualTo(1));
        for (String id : ids) {
            assertThat(receiver.requests()).filteredOn(r -> id.equals(r.key())).as("two 503s, then accepted").hasSize(3);
        }
        List<JsonNode> delivered = Outboxes.ledger(store, "notification-delivered");
        assertThat(delivered).hasSize(3);
        for (JsonNode d : delivered) {
            assertThat(d.get("attempt").asInt()).isEqualTo(1);
            assertThat(d.get("answer").asText()).isEqualTo("HTTP 200: accepted");
            assertThat(d.get("tries")).extracting(JsonNode::asText)
                    .containsExactly("HTTP 503: busy, try again", "HTTP 503: busy, try again", "HTTP 200: accepted");
        }
        PageReceiver.Request first = receiver.requests().get(0);
        assertThat(first.headers()).containsEntry("content-type", "application/json");
        JsonNode body = new ObjectMapper().readTree(first.body());
        assertThat(body.get("id").asText()).isEqualTo(first.key());
        assertThat(body.get("kind").asText()).isEqualTo("brake");
        assertThat(body.get("cluster").asText()).isEqualTo("fares-3");
        assertThat(body.get("link").asText()).isEqualTo("https://tend.larkspur.example/#fleet");
        // the listener hears of an outcome just after its transaction commits
        Outboxes.await("three delivered outcomes", Duration.ofSeconds(5),
                () -> outcomes.containsKey("oncall/delivered") && outcomes.get("oncall/delivered").get() == 3);
    }

    @Test
    void aPageTheReceiverRefusesIsLedgeredAsFailedAtOnceWithItsAnswer() throws Exception {
        receiver = PageReceiver.http().status(400);
        start("retries: 3, backoff: 1s", Duration.ofMillis(50));
        Outboxes.enqueue(store, "loop/fares-3/n2", "oncall", "loop", "fares-3", "automation stopped on fares-3/n2");
        courier.wake();
        Outboxes.await("a final failure", Duration.ofSeconds(20), () -> Outboxes.row(store, "loop/fares-3/n2").state().equals(PageRow.FAILED));

        assertThat(receiver.requests()).as("a 4xx is the receiver's decision: never tried again").hasSize(1);
        List<JsonNode> failed = Outboxes.ledger(store, "notification-failed");
        assertThat(failed).singleElement().satisfies(f -> {
            assertThat(f.get("final").asBoolean()).isTrue();
            assertThat(f.get("answer").asText()).isEqualTo("HTTP 400: refused");
            assertThat(f.get("id").asText()).isEqualTo("loop/fares-3/n2");
        });
        assertThat(Outboxes.ledger(store, "notification-delivered")).isEmpty();
    }

    @Test
    void aReceiverThatKeepsFailingIsTriedAgainLaterEachAttemptLedgeredUntilItAccepts() throws Exception {
        receiver = PageReceiver.http().failFirst(2);
        start("retries: 0", Duration.ofMillis(100));
        Outboxes.enqueue(store, "flapping/dispatch-1", "oncall", "flapping", "dispatch-1", "dispatch-1/n3/heartbeat is flapping");
        courier.wake();
        Outboxes.await("delivery on the third attempt", Duration.ofSeconds(20),
                () -> Outboxes.row(store, "flapping/dispatch-1").state().equals(PageRow.DELIVERED));

        List<JsonNode> failed = Outboxes.ledger(store, "notification-failed");
        assertThat(failed).hasSize(2).allSatisfy(f -> {
            assertThat(f.get("final").asBoolean()).isFalse();
            assertThat(f.get("retry_at").asText()).isNotEmpty();
        });
        assertThat(failed).extracting(f -> f.get("attempt").asInt()).containsExactly(1, 2);
        assertThat(Outboxes.ledger(store, "notification-delivered")).singleElement()
                .satisfies(d -> assertThat(d.get("attempt").asInt()).isEqualTo(3));
        assertThat(Outboxes.row(store, "flapping/dispatch-1").attempts()).isEqualTo(3);
        Outboxes.await("two retry outcomes", Duration.ofSeconds(5),
                () -> outcomes.containsKey("oncall/retry") && outcomes.get("oncall/retry").get() == 2);
    }

    @Test
    void deliveryIsGivenUpAfterTheChannelsLimitAndLedgeredAsFinal() throws Exception {
        receiver = PageReceiver.http().failFirst(1_000);
        store = Store.openSqlite(dir.resolve("tend.db"));
        String yaml = """
                channels:
                  oncall:
                    webhook: { url: "%s", retries: 0 }
                    give-up-after: 1s
                """.formatted(receiver.url());
        Senders senders = Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter()));
        courier = new Courier(store, senders, Clock.systemUTC(), Duration.ofMillis(200), Courier.Listener.NONE).start();
        Outboxes.enqueue(store, "brake/2", "oncall", "brake", "fares-3", "fleet brake engaged");
        Outboxes.await("giving up", Duration.ofSeconds(20), () -> Outboxes.row(store, "brake/2").state().equals(PageRow.FAILED));

        List<JsonNode> failed = Outboxes.ledger(store, "notification-failed");
        assertThat(failed.get(failed.size() - 1).get("final").asBoolean()).isTrue();
        assertThat(failed.subList(0, failed.size() - 1)).allSatisfy(f -> assertThat(f.get("final").asBoolean()).isFalse());
        assertThat(Outboxes.row(store, "brake/2").lastAnswer()).isEqualTo("HTTP 503: busy, try again");
    }
}
