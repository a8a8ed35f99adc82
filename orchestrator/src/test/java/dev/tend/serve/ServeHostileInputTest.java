package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.api.ApiServer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;

import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/** What a careless or hostile caller sends is answered in plain words, and the server goes on. */
class ServeHostileInputTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    private static void assertPlain400(ServeFixture.Response r, String what) {
        assertThat(r.status()).as(what + ": " + r.text()).isEqualTo(400);
        assertThat(r.json().get("error").asText()).isEqualTo("invalid-input");
        assertThat(r.json().get("message").asText()).as(what)
                .doesNotContain("dev.tend").doesNotContain("java.").doesNotContain("`").doesNotContain("Exception");
    }

    @Test
    void nullListStringAndRepeatedFieldBodiesAreBadRequestsInPlainWords() {
        serve.start(dir);
        for (String body : List.of("null", "[]", "\"x\"", "42", "{\"reason\":\"a\",\"reason\":\"b\"}", "{\"reason\":[1]}",
                "{\"reason\":\"a\"} {}", "{\"reason\":")) {
            assertPlain400(serve.post("/api/v1/brake/engage", OLGA, body), "brake/engage " + body);
        }
        for (String body : List.of("null", "[]", "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\",\"until\":5}",
                "{\"cluster\":{\"a\":1},\"reason\":\"r\",\"owner\":\"o\"}", "{\"cluster\":\"fares-3\",\"cluster\":\"fares-3\"}")) {
            assertPlain400(serve.post("/api/v1/exclusions", OLGA, body), "exclusions " + body);
        }
        assertThat(serve.post("/api/v1/brake/engage", OLGA, "null").json().get("message").asText())
                .isEqualTo("the body must be a JSON object like {\"reason\": \"...\"}, got null");
        assertThat(serve.get("/api/v1/brake", VERA).status()).isEqualTo(200);
    }

    @Test
    void anExclusionUntilTheYear9999IsRefusedAndTheServerGoesOn() {
        serve.start(dir);
        ServeFixture.Response r = serve.post("/api/v1/exclusions", OLGA,
                "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\",\"until\":\"9999-12-31T00:00:00Z\"}");
        assertPlain400(r, "until 9999");
        assertThat(r.json().at("/problems/0/field").asText()).isEqualTo("until");
        ServeFixture.Response ok = serve.post("/api/v1/exclusions", OLGA, "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\"}");
        assertThat(ok.status()).as(ok.text()).isEqualTo(201);
    }

    @Test
    void aTransitionDatedIn2263IsRefusedByLineAndTheServerGoesOn() {
        serve.start(dir);
        String now = java.time.Instant.now().minusSeconds(60).toString();
        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA,
                "{\"at\":\"" + now + "\",\"cluster\":\"fares-3\",\"node\":\"n1\",\"signal\":\"heartbeat\",\"state\":\"silent\"}\n"
                        + "{\"at\":\"2263-01-01T00:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}\n");
        assertThat(r.status()).as(r.text()).isEqualTo(207);
        assertThat(r.json().at("/problems/0/line").asInt()).isEqualTo(2);
        assertThat(r.json().at("/problems/0/message").asText()).contains("after 2200");
        ServeFixture.Response next = serve.post("/api/v1/transitions", OLGA,
                "{\"at\":\"" + now + "\",\"cluster\":\"dispatch-1\",\"node\":\"n1\",\"signal\":\"heartbeat\",\"state\":\"silent\"}");
        assertThat(next.status()).as("the server goes on: " + next.text()).isEqualTo(200);
    }

    @Test
    void aChunkedBodyLargerThanTheCapIsRefusedWith413AndTheJsonError() throws Exception {
        serve.start(dir);
        long size = ApiServer.MAX_BODY + (4 << 20);
        // an InputStream publisher has no length, so the client sends the body in chunks (RFC 9112 section 7.1)
        HttpRequest req = HttpRequest.newBuilder(URI.create(serve.server().url() + "/api/v1/transitions"))
                .header("Authorization", "Bearer " + OLGA)
                .POST(HttpRequest.BodyPublishers.ofInputStream(() -> new Filler(size))).timeout(Duration.ofSeconds(60)).build();
        HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
        HttpResponse<String> r;
        try {
            r = http.send(req, HttpResponse.BodyHandlers.ofString());
        } catch (IOException cutOff) {
            // the server may close the connection once it answered; the answer must then still have been 413: ask what it logged
            throw new AssertionError("the server cut the connection without an answer: " + cutOff);
        }
        assertThat(r.statusCode()).as(r.body()).isEqualTo(413);
        JsonNode j = ApiJson.MAPPER.readTree(r.body());
        assertThat(j.get("error").asText()).isEqualTo("too-large");
        assertThat(j.get("message").asText()).contains("larger than 32 MiB");
        assertThat(serve.get("/api/v1/brake", VERA).status()).isEqualTo(200);
    }

    /** {@code size} bytes of blank lines, made as they are read. */
    private static final class Filler extends InputStream {
        private long left;

        Filler(long size) {
            left = size;
        }

        @Override
        public int read() {
            if (left <= 0) return -1;
            left--;
            return '\n';
        }

        @Override
        public int read(byte[] b, int off, int len) {
            if (left <= 0) return -1;
            int n = (int) Math.min(len, left);
            java.util.Arrays.fill(b, off, off + n, (byte) '\n');
            left -= n;
            return n;
        }
    }
}
