package dev.tend.console;

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

/**
 * A real {@code tend serve} for the console's tests: the bundled playbook library and the
 * Larkspur fleet (invented), a SQLite store in a temporary folder, two tokens (an approver
 * who is also an operator, and a viewer), on a free loopback port. Its log is kept for a
 * failure message.
 */
final class ConsoleServer implements AutoCloseable {
    static final String ANNA = "console-anna-approver-operator";
    static final String VERA = "console-vera-viewer";

    private final StringWriter log = new StringWriter();
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
    private final Store store;
    private final TendServer server;

    record Response(int status, String body) {
    }

    private ConsoleServer(Path dir) throws IOException {
        this(dir, 600, dev.tend.serve.TimeScale.real(), copyWithChannels(library(), dir.resolve("library")));
    }

    private ConsoleServer(Path dir, double speedup, dev.tend.serve.TimeScale timeScale, Path library) throws IOException {
        Files.writeString(dir.resolve("tokens.yaml"), "tokens:\n"
                + "  - { name: anna, roles: [approver, operator], sha256: " + Tokens.hash(ANNA) + " }\n"
                + "  - { name: vera, roles: [viewer], sha256: " + Tokens.hash(VERA) + " }\n");
        PlaybookSet set = PlaybookLoader.load(library);
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(library.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.following(Duration.ofMinutes(2)));
        store = Store.openSqlite(dir.resolve("tend.db"));
        // simulated actions 600 times faster: the library's 8-20 minute node replacement takes a second or two
        server = TendServer.start(store, ServeSettings.builder(setup).listen("127.0.0.1", 0)
                .tokens(TokenFile.load(dir.resolve("tokens.yaml"))).speedup(speedup).timeScale(timeScale).tick(Duration.ofMillis(500))
                .workDir(dir).log(new PrintWriter(log, true)).build());
    }

    static ConsoleServer start(Path dir) {
        try {
            return new ConsoleServer(dir);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * A server whose processing time runs {@code factor} times faster than the wall clock, as in
     * {@code tend demo}, its simulated actions as fast; the bundled library as it is (pages go
     * to the log), so that nothing but what a test does waits for a person.
     */
    static ConsoleServer accelerated(Path dir, double factor) {
        try {
            return new ConsoleServer(dir, factor, dev.tend.serve.TimeScale.accelerated(Instant.now(), factor), library());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * The library with channels, so that pages have somewhere to go: {@code oncall} (tend's own
     * pages, such as an approval request) runs a command that never succeeds, so its pages stay
     * undelivered and the fleet page lists them; {@code platform-oncall} writes to the log.
     */
    private static Path copyWithChannels(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (var files = Files.list(from)) {
            for (Path f : files.filter(Files::isRegularFile).toList()) Files.copy(f, to.resolve(f.getFileName()));
        }
        Files.writeString(to.resolve("tend.yaml"), Files.readString(to.resolve("tend.yaml")) + """

                channels:
                  oncall:
                    command: ["false"]
                  platform-oncall:
                    log: {}
                """);
        return to;
    }

    /** playbooks/library of the repository (tests run in the module's folder). */
    static Path library() {
        for (Path p = Path.of("").toAbsolutePath(); p != null; p = p.getParent()) {
            Path lib = p.resolve("playbooks").resolve("library");
            if (Files.isRegularFile(lib.resolve("fleet.yaml"))) return lib;
        }
        throw new IllegalStateException("playbooks/library not found above " + Path.of("").toAbsolutePath());
    }

    String url() {
        return server.url();
    }

    /**
     * Reports a node of {@code cluster} silent since ten minutes ago: with event time two
     * minutes behind processing time, the library's confirm-for of 5m has passed at once.
     */
    void silentSinceTenMinutes(String cluster, String node) {
        String line = "{\"at\":\"" + Instant.now().minus(Duration.ofMinutes(10)) + "\",\"cluster\":\"" + cluster
                + "\",\"node\":\"" + node + "\",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        Response r = post("/api/v1/transitions", ANNA, line);
        if (r.status() != 200) throw new AssertionError("transition refused: " + r);
    }

    Response get(String path, String token) {
        return send(HttpRequest.newBuilder(URI.create(url() + path)).GET(), token);
    }

    Response post(String path, String token, String body) {
        return send(HttpRequest.newBuilder(URI.create(url() + path)).POST(HttpRequest.BodyPublishers.ofString(body))
                .header("Content-Type", "application/json"), token);
    }

    private Response send(HttpRequest.Builder b, String token) {
        if (token != null) b.header("Authorization", "Bearer " + token);
        try {
            HttpResponse<String> r = http.send(b.timeout(Duration.ofSeconds(20)).build(), HttpResponse.BodyHandlers.ofString());
            return new Response(r.statusCode(), r.body());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
    }

    String log() {
        return log.toString();
    }

    @Override
    public void close() {
        server.close();
        store.close();
    }
}
