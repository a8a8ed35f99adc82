package dev.tend.executor;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.playbooks.HttpAction;
import dev.tend.playbooks.Template;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntUnaryOperator;

import static org.assertj.core.api.Assertions.assertThat;

/** The http executor against a real HTTP server on loopback (the JDK's com.sun.net.httpserver). */
class HttpExecutorTest {
    private HttpServer server;
    private final List<Seen> seen = new CopyOnWriteArrayList<>();
    private final AtomicInteger requests = new AtomicInteger();
    /** Status to answer for the n-th request (1-based). */
    private volatile IntUnaryOperator status = n -> 200;
    private volatile String answer = "ok";
    private volatile long delayMs;
    private final HttpExecutor executor = new HttpExecutor(Duration.ofMillis(10), Duration.ofMillis(40));

    record Seen(String method, String path, String key, String contentType, String body) {
    }

    @BeforeEach
    void start() throws IOException {
        server = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
        server.setExecutor(Executors.newCachedThreadPool(r -> {
            Thread t = new Thread(r, "test-receiver");
            t.setDaemon(true);
            return t;
        }));
        server.createContext("/", this::handle);
        server.start();
    }

    @AfterEach
    void stop() {
        server.stop(0);
        executor.close();
    }

    private void handle(HttpExchange ex) throws IOException {
        int n = requests.incrementAndGet();
        String body = new String(ex.getRequestBody().readAllBytes(), StandardCharsets.UTF_8);
        seen.add(new Seen(ex.getRequestMethod(), ex.getRequestURI().getPath(), ex.getRequestHeaders().getFirst("Idempotency-Key"),
                ex.getRequestHeaders().getFirst("Content-Type"), body));
        if (delayMs > 0) {
            try {
                Thread.sleep(delayMs); // the receiver is slow; the test itself never waits this long
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        byte[] out = answer.getBytes(StandardCharsets.UTF_8);
        ex.sendResponseHeaders(status.applyAsInt(n), out.length);
        try (OutputStream os = ex.getResponseBody()) {
            os.write(out);
        } catch (IOException gone) {
            // the client gave up (timeout test)
        }
    }

    private String url(String path) {
        return "http://127.0.0.1:" + server.getAddress().getPort() + path;
    }

    private static Effect.CallExecutor call(HttpAction action, Duration timeout) {
        return new Effect.CallExecutor("r000007", "restart", 1, "r000007/restart/1", action,
                Target.node(Id.of("fares-3"), Id.of("n2")), "restart-stopped-process", timeout);
    }

    private static HttpAction action(String url, String method, Map<String, Object> body, int retries) {
        return new HttpAction(Id.of("restart-process"), new Template(url), method, body, null, retries);
    }

    private static Input.ExecutorResult run(HttpExecutor ex, Effect.CallExecutor call) throws Exception {
        CompletableFuture<Input.ExecutorResult> f = new CompletableFuture<>();
        ex.execute(call, f::complete);
        return f.get(10, TimeUnit.SECONDS);
    }

    @Test
    void sendsTheRenderedBodyToTheRenderedUrlWithTheIdempotencyKeyHeader() throws Exception {
        HttpAction a = action(url("/v1/clusters/{cluster}/nodes/{node}/restart"), "POST",
                Map.of("run", "{run}", "attempt", "{attempt}", "requested-by", "tend"), 0);

        Input.ExecutorResult r = run(executor, call(a, Duration.ofSeconds(5)));

        assertThat(r.success()).as(r.message()).isTrue();
        assertThat(r.runId()).isEqualTo("r000007");
        assertThat(r.detail()).containsEntry("status", 200).containsEntry("response", "ok").containsEntry("tries", 1);
        assertThat(seen).hasSize(1);
        Seen s = seen.get(0);
        assertThat(s.method()).isEqualTo("POST");
        assertThat(s.path()).isEqualTo("/v1/clusters/fares-3/nodes/n2/restart");
        assertThat(s.key()).isEqualTo("r000007/restart/1");
        assertThat(s.contentType()).isEqualTo("application/json");
        assertThat(new ObjectMapper().readTree(s.body()))
                .isEqualTo(new ObjectMapper().readTree("{\"run\":\"r000007\",\"attempt\":\"1\",\"requested-by\":\"tend\"}"));
    }

    @Test
    void usesTheActionsMethodAndSendsNoBodyWhenTheActionHasNone() throws Exception {
        Input.ExecutorResult r = run(executor, call(action(url("/v1/{cluster}/leader"), "DELETE", Map.of(), 0), Duration.ofSeconds(5)));

        assertThat(r.success()).as(r.message()).isTrue();
        assertThat(seen.get(0).method()).isEqualTo("DELETE");
        assertThat(seen.get(0).body()).isEmpty();
        assertThat(seen.get(0).contentType()).isNull();
        assertThat(seen.get(0).key()).isEqualTo("r000007/restart/1");
    }

    @Test
    void triesAgainOn503WithTheSameKeyUntilItSucceeds() throws Exception {
        status = n -> n <= 2 ? 503 : 200;

        Input.ExecutorResult r = run(executor, call(action(url("/x"), "POST", Map.of("a", 1), 3), Duration.ofSeconds(5)));

        assertThat(r.success()).as(r.message()).isTrue();
        assertThat(r.detail()).containsEntry("tries", 3).containsEntry("status", 200);
        assertThat(seen).extracting(Seen::key).containsExactly("r000007/restart/1", "r000007/restart/1", "r000007/restart/1");
    }

    @Test
    void givesUpOn5xxOnceItsRetriesAreSpent() throws Exception {
        status = n -> 500;
        answer = "disk on fire";

        Input.ExecutorResult r = run(executor, call(action(url("/x"), "POST", Map.of("a", 1), 2), Duration.ofSeconds(5)));

        assertThat(r.success()).isFalse();
        assertThat(r.message()).isEqualTo("HTTP 500 after 3 tries");
        assertThat(r.detail()).containsEntry("status", 500).containsEntry("response", "disk on fire").containsEntry("tries", 3);
        assertThat(requests).hasValue(3);
    }

    @Test
    void neverTriesAgainOn400() throws Exception {
        status = n -> 400;
        answer = "{\"error\":\"unknown cluster\"}";

        Input.ExecutorResult r = run(executor, call(action(url("/x"), "POST", Map.of("a", 1), 5), Duration.ofSeconds(5)));

        assertThat(r.success()).isFalse();
        assertThat(r.message()).isEqualTo("HTTP 400 (not tried again: the receiver refused the request)");
        assertThat(r.detail()).containsEntry("status", 400).containsEntry("response", "{\"error\":\"unknown cluster\"}");
        assertThat(requests).hasValue(1);
    }

    @Test
    void failsAtTheTimeoutWhenTheReceiverDoesNotAnswer() throws Exception {
        delayMs = 3000;
        long t0 = System.nanoTime();

        Input.ExecutorResult r = run(executor, call(action(url("/slow"), "POST", Map.of("a", 1), 3), Duration.ofMillis(300)));

        long tookMs = TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0);
        assertThat(r.success()).isFalse();
        assertThat(r.message()).startsWith("timed out after 300 ms");
        assertThat(tookMs).as("answered at the timeout, not when the receiver finished").isLessThan(2000);
        assertThat(requests).as("a timed-out attempt leaves no time to try again").hasValue(1);
    }

    @Test
    void triesAgainWhenTheConnectionIsRefused() throws Exception {
        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        HttpAction a = action("http://127.0.0.1:" + closedPort + "/x", "POST", Map.of("a", 1), 2);

        Input.ExecutorResult r = run(executor, call(a, Duration.ofSeconds(5)));

        assertThat(r.success()).isFalse();
        assertThat(r.message()).startsWith("could not reach 127.0.0.1:" + closedPort + " after 3 tries");
        assertThat(r.detail()).containsEntry("tries", 3);
    }

    @Test
    void keepsOnlyTheFirstKibOfTheResponseBody() throws Exception {
        answer = "x".repeat(5000);

        Input.ExecutorResult r = run(executor, call(action(url("/x"), "POST", Map.of("a", 1), 0), Duration.ofSeconds(5)));

        assertThat(r.success()).isTrue();
        assertThat((String) r.detail().get("response")).hasSize(HttpExecutor.BODY_LIMIT);
    }

    @Test
    void mayAlwaysBeAskedAgainBecauseTheReceiverDeduplicatesByKey() {
        assertThat(executor.canAskAgain(call(action(url("/x"), "POST", Map.of(), 0), Duration.ofSeconds(1)))).isTrue();
        assertThat(executor.kind()).isEqualTo("http");
    }
}
