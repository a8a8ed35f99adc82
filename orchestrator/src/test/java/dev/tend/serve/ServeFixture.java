package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.Store;
import org.junit.jupiter.api.extension.AfterAllCallback;
import org.junit.jupiter.api.extension.AfterEachCallback;
import org.junit.jupiter.api.extension.ExtensionContext;
import org.junit.jupiter.api.extension.TestWatcher;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.function.BooleanSupplier;

/**
 * A real {@code tend serve} for tests: policy, fleet and tokens written to a temporary
 * folder, a SQLite store there, the server on a free loopback port, and a real HTTP client.
 * Its log is printed only when a test fails. Register with {@code @RegisterExtension}.
 */
final class ServeFixture implements AfterEachCallback, AfterAllCallback, TestWatcher {
    /** Token texts by holder; the tokens file stores only their SHA-256. */
    static final String OLGA = "tok-olga-operator", VERA = "tok-vera-viewer", ANNA = "tok-anna-approver",
            BEN = "tok-ben-approver", AUTOMATION = "tok-automation-approver", OTTO = "tok-otto-operator-approver";

    static final String FLEET = """
            fleet: larkspur-test   # invented, like every name here
            clusters:
              - id: fares-3
                tags: { tier: critical, team: payments }
                replication: { factor: 3, min-healthy: 2 }
                nodes: [ { id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c } ]
              - id: dispatch-1
                tags: { tier: standard, team: operations }
                nodes: [ { id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c } ]
              - id: tickets-12
                tags: { tier: standard, team: ticketing }
                nodes: [ { id: n1, zone: z-b }, { id: n2, zone: z-c }, { id: n3, zone: z-a } ]
            """;
    static final String ACTIONS = """
            actions:
              restart-process: { simulated: { duration: 1s, success: 1.0, clears: [process-down] } }
              replace-node: { simulated: { duration: 30m, success: 1.0, clears: [heartbeat] } }
            """;
    /** The brake is kept out of the way: three clusters would otherwise be a large-scale event at once. */
    static final String CONFIG = """
            brake:
              engage-at: { clusters: 100, fraction: 0.9 }
              release-below: { clusters: 50, fraction: 0.5 }
            """;

    private final StringWriter log = new StringWriter();
    private final boolean perClass;
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
    private Path dir;
    private Duration approvalExpiry = Duration.ofMinutes(30);
    private Duration stepTimeout = Duration.ofMinutes(5);
    private Duration confirmFor = Duration.ZERO;
    private Duration eventTimeLag = Duration.ofMinutes(2);
    /** The access tests send many wrong tokens on purpose; ServeEdgesTest sets the default back. */
    private int wrongTokens = 10_000;
    private Store store;
    private TendServer server;

    record Response(int status, JsonNode json, String text) {
    }

    /** A server for one test, stopped after it. */
    ServeFixture() {
        this(false);
    }

    private ServeFixture(boolean perClass) {
        this.perClass = perClass;
    }

    /** One server shared by the tests of a class (with {@code @TestInstance(PER_CLASS)}), stopped after the last. */
    static ServeFixture perClass() {
        return new ServeFixture(true);
    }

    ServeFixture approvalExpiry(Duration d) {
        approvalExpiry = d;
        return this;
    }

    ServeFixture stepTimeout(Duration d) {
        stepTimeout = d;
        return this;
    }

    /** confirm-for of the replace-standard playbook (default 0s). */
    ServeFixture confirmFor(Duration d) {
        confirmFor = d;
        return this;
    }

    /** Wrong tokens one address may send a minute before 429 (the server's default is 10; the fixture's 10,000). */
    ServeFixture wrongTokens(int n) {
        wrongTokens = n;
        return this;
    }

    /** How far event time trails processing time (default 2m, as tend serve). */
    ServeFixture eventTimeLag(Duration d) {
        eventTimeLag = d;
        return this;
    }

    /** Writes the policy into {@code folder} and starts a server on a new store there. */
    ServeFixture start(Path folder) {
        this.dir = folder;
        try {
            Path pb = Files.createDirectories(dir.resolve("playbooks"));
            Files.writeString(pb.resolve("actions.yaml"), ACTIONS);
            Files.writeString(pb.resolve("tend.yaml"), CONFIG);
            Files.writeString(pb.resolve("restart-critical.yaml"), """
                    playbook: restart-critical
                    version: 1
                    trigger: { signal: process-down, state: breach, scope: node, confirm-for: 0s, clusters: { tier: [critical] } }
                    approval: { clusters: { tier: [critical] }, expires-after: %s }
                    steps:
                      - { id: restart, action: restart-process, timeout: 5m }
                    """.formatted(seconds(approvalExpiry)));
            Files.writeString(pb.resolve("replace-standard.yaml"), """
                    playbook: replace-standard
                    version: 1
                    trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: %s, clusters: { tier: [standard] } }
                    steps:
                      - { id: replace, action: replace-node, timeout: %s }
                    """.formatted(seconds(confirmFor), seconds(stepTimeout)));
            Files.writeString(dir.resolve("fleet.yaml"), FLEET);
            Files.writeString(dir.resolve("tokens.yaml"), "tokens:\n"
                    + entry("olga", "[operator]", OLGA) + entry("vera", "[viewer]", VERA)
                    + entry("anna", "[approver]", ANNA) + entry("ben", "[approver]", BEN)
                    + entry("automation", "[approver]", AUTOMATION) + entry("otto", "[operator, approver]", OTTO));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return restart();
    }

    /** Starts a server on the store in the folder (again, after {@link #stop()}). */
    ServeFixture restart() {
        PlaybookSet set = PlaybookLoader.load(dir.resolve("playbooks"));
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(dir.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.following(eventTimeLag));
        Tokens tokens = TokenFile.load(dir.resolve("tokens.yaml"));
        store = Store.openSqlite(dir.resolve("tend.db"));
        server = TendServer.start(store, ServeSettings.builder(setup).listen("127.0.0.1", 0).tokens(tokens)
                .speedup(4).tick(Duration.ofMillis(500)).wrongTokens(wrongTokens).workDir(dir).log(new PrintWriter(log, true)).build());
        return this;
    }

    /** Stops the server and closes its store; the folder stays for {@link #restart()}. */
    void stop() {
        if (server != null) server.close();
        if (store != null) store.close();
        server = null;
        store = null;
    }

    TendServer server() {
        return server;
    }

    Store store() {
        return store;
    }

    Path dir() {
        return dir;
    }

    private static String seconds(Duration d) {
        return d.toSeconds() + "s";
    }

    private static String entry(String name, String roles, String token) {
        return "  - { name: " + name + ", roles: " + roles + ", sha256: " + Tokens.hash(token) + " }\n";
    }

    /** One transition line at the current wall time. */
    static String transition(String cluster, String node, String signal, String state) {
        return "{\"at\":\"" + Instant.now() + "\",\"cluster\":\"" + cluster + "\",\"node\":\"" + node + "\",\"signal\":\""
                + signal + "\",\"state\":\"" + state + "\"}";
    }

    Response get(String path, String token) {
        return send(HttpRequest.newBuilder(uri(path)).GET(), token);
    }

    Response post(String path, String token, String body) {
        return send(HttpRequest.newBuilder(uri(path)).POST(HttpRequest.BodyPublishers.ofString(body))
                .header("Content-Type", "application/json"), token);
    }

    Response delete(String path, String token) {
        return send(HttpRequest.newBuilder(uri(path)).DELETE(), token);
    }

    Response send(String method, String path, String token, String body) {
        HttpRequest.BodyPublisher p = body == null ? HttpRequest.BodyPublishers.noBody() : HttpRequest.BodyPublishers.ofString(body);
        return send(HttpRequest.newBuilder(uri(path)).method(method, p), token);
    }

    private URI uri(String path) {
        return URI.create(server.url() + path);
    }

    private Response send(HttpRequest.Builder b, String token) {
        if (token != null) b.header("Authorization", "Bearer " + token);
        try {
            HttpResponse<String> r = http.send(b.timeout(Duration.ofSeconds(20)).build(), HttpResponse.BodyHandlers.ofString());
            JsonNode json = null;
            try {
                json = r.body().isEmpty() ? null : ApiJson.MAPPER.readTree(r.body());
            } catch (IOException notJson) {
                // /metrics and console files are text
            }
            return new Response(r.statusCode(), json, r.body());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
    }

    /** Waits for a state of the server (not for time), polling every 20 ms, at most {@code limit}. */
    static void awaitTrue(String what, Duration limit, BooleanSupplier condition) {
        long deadline = System.nanoTime() + limit.toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) throw new AssertionError("timed out after " + limit + " waiting until " + what);
            try {
                Thread.sleep(20);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError(e);
            }
        }
    }

    /** The run id of the only pending approval, once there is one. */
    String awaitPendingApproval() {
        String[] run = new String[1];
        awaitTrue("an approval is pending", Duration.ofSeconds(10), () -> {
            Response r = get("/api/v1/approvals", VERA);
            if (r.json() == null || r.json().size() == 0) return false;
            run[0] = r.json().get(0).get("run").asText();
            return true;
        });
        return run[0];
    }

    JsonNode run(String id) {
        return get("/api/v1/runs/" + id, VERA).json();
    }

    String log() {
        return log.toString();
    }

    @Override
    public void afterEach(ExtensionContext context) {
        if (!perClass) stop();
    }

    @Override
    public void afterAll(ExtensionContext context) {
        stop();
    }

    @Override
    public void testFailed(ExtensionContext context, Throwable cause) {
        System.err.println("---- tend serve log of " + context.getDisplayName() + " ----\n" + log);
    }
}
