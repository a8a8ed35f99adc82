package dev.tend.console;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.engine.LedgerKind;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.console.ConsoleServer.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/** The routes the console adds to the API: the handover report and the playbooks with their steps. */
class ConsoleApiTest {
    @TempDir
    Path dir;

    @Test
    void theHandoverReportCountsARunThatReplacedASilentNodeAsJsonAndAsHtml() {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            Instant since = Instant.now().minus(Duration.ofHours(1)).truncatedTo(ChronoUnit.SECONDS);
            // tickets-12 is tier standard: replace-silent-node starts without a person
            server.silentSinceTenMinutes("tickets-12", "n2");
            awaitRunEnded(server);

            ConsoleServer.Response json = server.get("/api/v1/handover?since=" + since, VERA);
            assertThat(json.status()).as(json.body()).isEqualTo(200);
            JsonNode r = parse(json.body());
            assertThat(r.at("/totals/started").asInt()).isEqualTo(1);
            assertThat(r.at("/totals/succeeded").asInt()).isEqualTo(1);
            assertThat(r.at("/by_playbook/replace-silent-node/started").asInt()).isEqualTo(1);
            assertThat(r.at("/nodes_remediated/replace-silent-node/0/node").asText()).isEqualTo("n2");
            assertThat(r.at("/nodes_remediated/replace-silent-node/0/actions").toString()).isEqualTo("[\"drain-node\",\"replace-node\"]");
            assertThat(r.at("/ledger/verified").asBoolean()).isTrue();
            assertThat(r.at("/needs_attention").asBoolean()).isFalse();
            assertThat(r.at("/since").asText()).isEqualTo(since.toString());

            ConsoleServer.Response html = server.get("/api/v1/handover?format=html&since=" + since, VERA);
            assertThat(html.status()).isEqualTo(200);
            assertThat(html.body()).startsWith("<!DOCTYPE html>").contains("replace-silent-node", "tickets-12");
        }
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "                                                            | since is required: an RFC 3339 time like 2027-03-14T22:00:00Z",
            "since=yesterday                                             | since must be an RFC 3339 time like 2027-03-14T22:00:00Z, got 'yesterday'",
            "since=2027-03-14T22:00:00Z&until=2027-03-14T21:00:00Z       | until (2027-03-14T21:00:00Z) must be after since (2027-03-14T22:00:00Z)",
            "since=2027-03-14T22:00:00Z&until=2027-03-14T22:00:00Z       | until (2027-03-14T22:00:00Z) must be after since (2027-03-14T22:00:00Z)",
            "since=2027-03-14T22:00:00Z&format=pdf                       | format must be json or html, got 'pdf'"})
    void aHandoverRequestOutOfShapeIsAnsweredWithWhatIsWrong(String query, String message) {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            ConsoleServer.Response r = server.get("/api/v1/handover" + (query == null ? "" : "?" + query), VERA);
            assertThat(r.status()).isEqualTo(400);
            JsonNode body = parse(r.body());
            assertThat(body.get("error").asText()).isEqualTo("invalid-input");
            assertThat(body.get("message").asText()).isEqualTo(message);
        }
    }

    @Test
    void theHandoverAndThePlaybooksNeedAToken() {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            assertThat(server.get("/api/v1/handover?since=2027-03-14T22:00:00Z", null).status()).isEqualTo(401);
            assertThat(server.get("/api/v1/playbooks", null).status()).isEqualTo(401);
            assertThat(server.get("/api/v1/playbooks", "not-a-token").status()).isEqualTo(401);
        }
    }

    @Test
    void playbooksListTheStepsARunGoesThrough() {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            ConsoleServer.Response r = server.get("/api/v1/playbooks", VERA);
            assertThat(r.status()).isEqualTo(200);
            JsonNode replace = null;
            for (JsonNode p : parse(r.body())) if (p.get("playbook").asText().equals("replace-silent-node")) replace = p;
            assertThat(replace).as(r.body()).isNotNull();
            assertThat(replace.get("version").asInt()).isEqualTo(1);
            assertThat(replace.get("mode").asText()).isEqualTo("live");
            // playbooks/library/replace-silent-node.yaml: drain, replace, settle (on-failure steps are not listed)
            assertThat(replace.get("steps").toString()).isEqualTo("[{\"step\":\"drain\",\"kind\":\"action\",\"detail\":\"drain-node\"},"
                    + "{\"step\":\"replace\",\"kind\":\"action\",\"detail\":\"replace-node\"},"
                    + "{\"step\":\"settle\",\"kind\":\"wait-healthy\",\"detail\":\"heartbeat\"}]");
        }
    }

    @Test
    void theVocabularyListsEveryLedgerKindWithItsFieldsAndEveryReasonCodeInGuardOrder() {
        try (ConsoleServer server = ConsoleServer.start(dir)) {
            assertThat(server.get("/api/v1/vocabulary", null).status()).isEqualTo(401);
            ConsoleServer.Response r = server.get("/api/v1/vocabulary", VERA);
            assertThat(r.status()).isEqualTo(200);
            JsonNode v = parse(r.body());
            List<String> kinds = new ArrayList<>();
            for (JsonNode k : v.get("ledger_kinds")) kinds.add(k.get("kind").asText());
            // among them the four an earlier console filter lacked
            assertThat(kinds).contains("candidate-dropped", "command-refused", "executor-result-ignored", "notification")
                    .doesNotHaveDuplicates().hasSize(LedgerKind.values().length);
            JsonNode runStarted = null;
            for (JsonNode k : v.get("ledger_kinds")) if (k.get("kind").asText().equals("run-started")) runStarted = k;
            assertThat(runStarted.get("fields").toString()).isEqualTo("[\"run\",\"playbook\",\"version\",\"cluster\",\"node\"]");
            List<String> codes = new ArrayList<>();
            for (JsonNode c : v.get("reason_codes")) codes.add(c.get("code").asText());
            // DESIGN.md section 4: unknown-target first, approval-required last
            assertThat(codes).first().isEqualTo("unknown-target");
            assertThat(codes).last().isEqualTo("approval-required");
            assertThat(v.get("reason_codes").get(codes.indexOf("fleet-brake")).get("verdict").asText()).isEqualTo("hold");
            assertThat(v.get("reason_codes").get(codes.indexOf("fleet-brake")).get("meaning").asText())
                    .isEqualTo("the fleet brake is engaged");
        }
    }

    private static void awaitRunEnded(ConsoleServer server) {
        long deadline = System.nanoTime() + Duration.ofSeconds(20).toNanos();
        while (System.nanoTime() < deadline) {
            JsonNode runs = parse(server.get("/api/v1/runs", VERA).body());
            if (runs.size() == 1 && !runs.get(0).get("ended_at").isNull()) {
                assertThat(runs.get(0).get("state").asText()).isEqualTo("succeeded");
                return;
            }
            try {
                Thread.sleep(50);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError(e);
            }
        }
        throw new AssertionError("the run did not end within 20s: " + server.get("/api/v1/runs", VERA).body() + "\n" + server.log());
    }

    private static JsonNode parse(String text) {
        try {
            return ApiJson.MAPPER.readTree(text);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
