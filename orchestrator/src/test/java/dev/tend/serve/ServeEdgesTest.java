package dev.tend.serve;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.Socket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;

import static dev.tend.serve.ServeFixture.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/** The server's edges: whom it answers, the headers of its console and its answers, and guessing tokens. */
class ServeEdgesTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture().wrongTokens(10);

    /** One raw HTTP/1.1 request with the given Host header (the JDK's client will not send another Host). */
    private String raw(String path, String host) throws Exception {
        URI u = URI.create(serve.server().url());
        try (Socket s = new Socket(u.getHost(), u.getPort())) {
            s.setSoTimeout(10_000);
            OutputStream out = s.getOutputStream();
            out.write(("GET " + path + " HTTP/1.1\r\nHost: " + host + "\r\nConnection: close\r\n\r\n").getBytes(StandardCharsets.US_ASCII));
            out.flush();
            InputStream in = s.getInputStream();
            ByteArrayOutputStream all = new ByteArrayOutputStream();
            in.transferTo(all);
            return all.toString(StandardCharsets.UTF_8);
        }
    }

    @Test
    void aHostHeaderTheServerDoesNotAnswerToIsMisdirectedEvenForMetrics() throws Exception {
        serve.start(dir);
        String port = String.valueOf(URI.create(serve.server().url()).getPort());
        String rebound = raw("/metrics", "tend.attacker.example:" + port);
        assertThat(rebound).startsWith("HTTP/1.1 421").contains("\"error\":\"misdirected\"").doesNotContain("tend_ledger_entries");
        assertThat(raw("/metrics", "localhost:" + port)).startsWith("HTTP/1.1 200").contains("tend_ledger_entries");
        assertThat(raw("/metrics", "127.0.0.1:" + port)).startsWith("HTTP/1.1 200");
    }

    @Test
    void theConsoleIsNeverFramedAndLoadsOnlyTheServersOwnFiles() {
        serve.start(dir);
        for (String path : new String[]{"/", "/api/v1/me"}) {
            HttpResponse<String> r = get(path, VERA);
            assertThat(r.headers().firstValue("X-Frame-Options")).hasValue("DENY");
            assertThat(r.headers().firstValue("X-Content-Type-Options")).hasValue("nosniff");
            assertThat(r.headers().firstValue("Content-Security-Policy").orElseThrow()).contains("frame-ancestors 'none'");
        }
        assertThat(get("/", null).headers().firstValue("Content-Security-Policy").orElseThrow())
                .contains("default-src 'self'").contains("script-src 'self'").doesNotContain("unsafe");
    }

    @Test
    void repeatedWrongTokensFromOneAddressAreAnsweredTooManyAttempts() {
        serve.start(dir);
        for (int i = 0; i < 10; i++) assertThat(get("/api/v1/me", "tok-guess-" + i).statusCode()).isEqualTo(401);
        HttpResponse<String> blocked = get("/api/v1/me", "tok-guess-11");
        assertThat(blocked.statusCode()).isEqualTo(429);
        assertThat(blocked.body()).contains("\"error\":\"too-many-attempts\"");
        assertThat(blocked.headers().firstValue("Retry-After")).isPresent();
        assertThat(get("/api/v1/me", VERA).statusCode()).as("the address waits, whatever token it sends").isEqualTo(429);
        assertThat(get("/api/v1/me", null).statusCode()).as("without a token it is no guess").isEqualTo(429);
    }

    @Test
    void anAcceptedTransitionIsAnsweredWithItsCountsAsJsonAndTheSameHeadersAsEveryRoute() throws Exception {
        serve.start(dir);
        HttpRequest post = HttpRequest.newBuilder(URI.create(serve.server().url() + "/api/v1/transitions")).timeout(Duration.ofSeconds(10))
                .header("Authorization", "Bearer " + ServeFixture.OLGA)
                .POST(HttpRequest.BodyPublishers.ofString(ServeFixture.transition("fares-3", "n1", "process-down", "clear"))).build();
        HttpResponse<String> r = HttpClient.newHttpClient().send(post, HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).isEqualTo(200);
        assertThat(r.body()).isEqualTo("{\"accepted\":1,\"rejected\":0,\"problems\":[]}");
        assertThat(r.headers().firstValue("Content-Type").orElseThrow()).startsWith("application/json");
        assertThat(r.headers().firstValue("Content-Length")).hasValue(String.valueOf(r.body().length()));
        assertThat(r.headers().firstValue("X-Content-Type-Options")).hasValue("nosniff");
        assertThat(r.headers().firstValue("X-Frame-Options")).hasValue("DENY");
    }

    private HttpResponse<String> get(String path, String token) {
        try {
            HttpRequest.Builder b = HttpRequest.newBuilder(URI.create(serve.server().url() + path)).timeout(Duration.ofSeconds(10));
            if (token != null) b.header("Authorization", "Bearer " + token);
            return HttpClient.newHttpClient().send(b.build(), HttpResponse.BodyHandlers.ofString());
        } catch (Exception e) {
            throw new AssertionError(e);
        }
    }
}
