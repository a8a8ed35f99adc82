package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.LeaseLostException;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import dev.tend.testing.EmbeddedPostgres;
import org.junit.jupiter.api.Test;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.BooleanSupplier;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Two instances of {@code tend serve} in one JVM on one real PostgreSQL: the first leads,
 * the second is a standby that answers reads, refuses writes with the leader's address, and
 * takes over when the leader stops; the stopped leader's store, still fenced with the old
 * epoch, can commit nothing. (The failover test does the same with processes and SIGKILL.)
 */
class LeaderLoopTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");
    private static final String TOKEN = "tok-olga-operator";
    private static final ObjectMapper JSON = new ObjectMapper();
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();

    @Test
    void aStandbyRefusesWritesWithTheLeadersAddressAndTakesOverWhenTheLeaderStops() throws Exception {
        EmbeddedPostgres pg = EmbeddedPostgres.get();
        String url = pg.createDatabase();
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(LIBRARY.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.following(Duration.ofMinutes(2)));
        Tokens tokens = TokenFile.parse("tokens.yaml", "tokens:\n  - { name: olga, roles: [operator, viewer], sha256: "
                + Tokens.hash(TOKEN) + " }\n");
        StringWriter log = new StringWriter();
        PrintWriter out = new PrintWriter(log, true);
        int portA = freePort(), portB = freePort();
        String addressA = "http://127.0.0.1:" + portA, addressB = "http://127.0.0.1:" + portB;
        List<Thread> threads = new ArrayList<>();
        try (Store storeA = Store.openJdbc(url, pg.user(), null); Store storeB = Store.openJdbc(url, pg.user(), null)) {
            LeaderLoop a = new LeaderLoop(storeA, settings(setup, tokens, portA, out), Duration.ofSeconds(2), "a", addressA, s -> { });
            threads.add(start(a));
            await(() -> a.leadership().leads(), log);
            LeaderLoop b = new LeaderLoop(storeB, settings(setup, tokens, portB, out), Duration.ofSeconds(2), "b", addressB, s -> { });
            threads.add(start(b));
            await(() -> "a".equals(b.leadership().view().leader()), log);
            try {
                HttpResponse<String> refused = post(portB);
                assertThat(refused.statusCode()).isEqualTo(503);
                assertThat(JSON.readTree(refused.body()).path("error").asText()).isEqualTo("not-leader");
                assertThat(refused.body()).contains("the leader is a at " + addressA);
                assertThat(refused.headers().firstValue("X-Tend-Leader")).contains(addressA);
                assertThat(post(portA).statusCode()).isEqualTo(200);
                await(() -> b.leadership().view().journalLag() == 0 && health(portB).path("unhealthy").asInt() == 1, log);
                JsonNode standby = health(portB).path("leader");
                assertThat(standby.path("role").asText()).isEqualTo("standby");
                assertThat(standby.path("leader_url").asText()).isEqualTo(addressA);
                assertThat(standby.path("epoch").asLong()).isEqualTo(1);

                a.close(); // a clean stop lets the lease lapse at once
                await(() -> "leader".equals(health(portB).path("leader").path("role").asText()), log);
                JsonNode leader = health(portB).path("leader");
                assertThat(leader.path("role").asText()).isEqualTo("leader");
                assertThat(leader.path("epoch").asLong()).isEqualTo(2);
                assertThat(health(portB).path("unhealthy").asInt()).as("the warm engine carried the transition").isEqualTo(1);
                assertThat(post(portB).statusCode()).isEqualTo(200);
                assertThatThrownBy(() -> storeA.useTransaction(tx -> tx.appendLedger(Instant.now(), "verdict", Map.of())))
                        .isInstanceOf(LeaseLostException.class).hasMessageContaining("epoch 2 is held by b at " + addressB);
                List<String> elected = new ArrayList<>();
                storeB.read(r -> {
                    r.forEachLedger(new LedgerFilter(null, null, null, null, "leader-elected", null), e -> elected.add(e.entry()));
                    return null;
                });
                assertThat(elected).hasSize(2);
                assertThat(elected.get(1)).contains("\"instance\":\"b\"").contains("\"epoch\":2");
                assertThat(log.toString()).contains("b leads (lease epoch 2) at " + addressB);
            } finally {
                a.close();
                b.close();
                for (Thread t : threads) t.join(30_000);
            }
        }
    }

    private static ServeSettings settings(EngineSetup setup, Tokens tokens, int port, PrintWriter log) {
        return ServeSettings.builder(setup).listen("127.0.0.1", port).tokens(tokens).tick(Duration.ofMillis(500)).log(log).build();
    }

    private static Thread start(LeaderLoop loop) {
        Thread t = new Thread(() -> {
            try {
                loop.run();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "leader-loop");
        t.start();
        return t;
    }

    private static void await(BooleanSupplier condition, StringWriter log) throws InterruptedException {
        long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) throw new AssertionError("not within 30 s; the instances' log:\n" + log);
            Thread.sleep(50);
        }
    }

    private HttpResponse<String> post(int port) throws Exception {
        String line = "{\"at\":\"" + Instant.now().minusSeconds(5) + "\",\"cluster\":\"fares-3\",\"node\":\"n2\","
                + "\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/transitions"))
                .header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(30)).POST(HttpRequest.BodyPublishers.ofString(line)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    private JsonNode health(int port) {
        try {
            HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/health"))
                    .header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(10)).build(), HttpResponse.BodyHandlers.ofString());
            return JSON.readTree(r.body());
        } catch (Exception e) {
            return JSON.createObjectNode();
        }
    }

    private static int freePort() throws Exception {
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }
}
