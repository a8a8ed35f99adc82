package dev.tend.page;

import dev.tend.fault.FaultFiles;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.serve.ServeSettings;
import dev.tend.serve.TendServer;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * 150 clusters go unhealthy at once through {@code tend serve}'s HTTP API: the fleet brake
 * engages, and exactly one page reaches the receiver, carrying the size of the event (not
 * the threshold's) and the console link; the flapping and loop pages the brake covers are
 * folded into it, never one page per cluster.
 */
class BrakeStormPagesTest {
    private static final String OLGA = "tok-olga-operator";

    @TempDir
    Path dir;

    @Test
    void aStormOf150ClustersSendsExactlyOneBrakePageWithTheCount() throws Exception {
        StringWriter log = new StringWriter();
        try (PageReceiver receiver = PageReceiver.http()) {
            EngineSetup setup = writePolicy(receiver.url());
            Tokens tokens = TokenFile.parse("tokens.yaml", "tokens:\n  - { name: olga, roles: [operator], sha256: " + Tokens.hash(OLGA) + " }\n");
            try (Store store = Store.openSqlite(dir.resolve("tend.db"));
                 TendServer server = TendServer.start(store, ServeSettings.builder(setup).listen("127.0.0.1", 0).tokens(tokens)
                         .tick(Duration.ofMillis(500)).workDir(dir).log(new PrintWriter(log, true)).build())) {
                StringBuilder lines = new StringBuilder();
                Instant at = Instant.now();
                for (int c = 1; c <= 150; c++) {
                    lines.append("{\"at\":\"").append(at).append("\",\"cluster\":\"dispatch-").append(c)
                            .append("\",\"node\":\"n1\",\"signal\":\"heartbeat\",\"state\":\"silent\"}\n");
                }
                HttpResponse<String> posted = HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(server.url() + "/api/v1/transitions"))
                        .header("Authorization", "Bearer " + OLGA).POST(HttpRequest.BodyPublishers.ofString(lines.toString())).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(posted.statusCode()).as(posted.body()).isEqualTo(200);

                Outboxes.await("the brake's page", Duration.ofSeconds(30), () -> !receiver.requests().isEmpty());
                Thread.sleep(3000); // anything else that would go out has had its chance
                assertThat(receiver.requests()).as(log.toString()).hasSize(1);
                JsonNode page = new ObjectMapper().readTree(receiver.requests().get(0).body());
                assertThat(page.get("id").asText()).isEqualTo("brake/1");
                assertThat(page.get("kind").asText()).isEqualTo("brake");
                assertThat(page.get("unhealthy_clusters").asInt()).isEqualTo(150);
                assertThat(page.get("message").asText()).startsWith("fleet brake engaged: 150 clusters unhealthy (93.8% of the fleet)");
                assertThat(page.get("link").asText()).isEqualTo(server.url() + "/#fleet");
                // the attempt is counted by channel and outcome (Prometheus text format)
                HttpResponse<String> metrics = HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(server.url() + "/metrics"))
                        .build(), HttpResponse.BodyHandlers.ofString());
                assertThat(metrics.body().lines()).contains("tend_notifications_total{channel=\"oncall\",outcome=\"delivered\"} 1.0");
            }
        }
    }

    private EngineSetup writePolicy(String url) throws Exception {
        Path pb = Files.createDirectories(dir.resolve("playbooks"));
        FaultFiles.writeReplacePolicy(pb, """
                brake:
                  engage-at: { clusters: 25, fraction: 0.08 }
                  release-below: { clusters: 10, fraction: 0.03 }
                channels:
                  oncall:
                    webhook: { url: "%s", retries: 2, backoff: 1s }
                pages:
                  brake-gather: 2s
                """.formatted(url), "30m", "0s", "40m");
        Files.writeString(dir.resolve("fleet.yaml"), FaultFiles.fleet("larkspur-storm", "dispatch", 160));
        PlaybookSet set = PlaybookLoader.load(pb);
        return new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")), BrakeThresholds.from(set.config().brake()),
                EventTimeMode.following(Duration.ofMinutes(2)));
    }
}
