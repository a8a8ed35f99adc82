package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.fault.TendProcess;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The {@code tend serve} processes of a failover test, each its own JVM (so a SIGKILL is
 * real), and how the test asks them who leads, what they hold and what they said: their
 * health, metrics and runs over HTTP with the operator token, their logs in the test folder.
 */
final class ServeInstances {
    private static final ObjectMapper JSON = new ObjectMapper();

    /** One started instance: its name (and log file {@code NAME.err}), port and process. */
    record Instance(String name, int port, Process process) {
    }

    private final Path dir;
    private final String token;
    private final List<String> serveArgs;
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
            .connectTimeout(Duration.ofSeconds(2)).build();
    /** The instances not yet killed, in the order they started. */
    final List<Instance> instances = new ArrayList<>();
    private int started;

    /**
     * @param dir       the test folder: logs go to {@code tend-N.err} there
     * @param token     the operator and viewer token the instances' tokens file knows
     * @param serveArgs the arguments of {@code tend serve} every instance shares (all but {@code --listen})
     */
    ServeInstances(Path dir, String token, List<String> serveArgs) {
        this.dir = dir;
        this.token = token;
        this.serveArgs = List.copyOf(serveArgs);
    }

    /** How many instances were started, killed ones included ({@code tend-1} to {@code tend-N}). */
    int started() {
        return started;
    }

    /** The client the instances are asked with. */
    HttpClient http() {
        return http;
    }

    /** Starts one more {@code tend serve} with the shared arguments and a port of its own. */
    Instance start() throws IOException {
        int port = TendProcess.freePort();
        String name = "tend-" + (++started);
        List<String> args = new ArrayList<>(List.of("serve", "--listen", "127.0.0.1:" + port));
        args.addAll(serveArgs);
        Process p = TendProcess.start(dir, name, args);
        Instance i = new Instance(name, port, p);
        instances.add(i);
        return i;
    }

    String log(Instance i) throws IOException {
        return i.name() + ":\n" + Files.readString(dir.resolve(i.name() + ".err"));
    }

    boolean stepsDown(Instance i) throws IOException {
        String text = Files.readString(dir.resolve(i.name() + ".err"));
        return text.contains(" steps down: ") || text.contains(" lost the leader lease ");
    }

    static void signal(String sig, Instance i) throws Exception {
        Process kill = new ProcessBuilder("kill", "-" + sig, String.valueOf(i.process().pid())).inheritIO().start();
        assertThat(kill.waitFor(10, TimeUnit.SECONDS)).isTrue();
        assertThat(kill.exitValue()).isZero();
    }

    JsonNode health(Instance i) {
        try {
            HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + i.port() + "/api/v1/health"))
                    .header("Authorization", "Bearer " + token).timeout(Duration.ofSeconds(2)).build(), HttpResponse.BodyHandlers.ofString());
            return r.statusCode() == 200 ? JSON.readTree(r.body()) : null;
        } catch (IOException | InterruptedException e) {
            return null;
        }
    }

    /** The leader's URL as {@code i}'s health names it; empty when it names none. */
    String leaderUrl(Instance i) {
        JsonNode h = health(i);
        return h == null ? "" : h.path("leader").path("leader_url").asText("");
    }

    boolean awaitRole(Instance i, String role, int seconds) throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(seconds);
        while (i.process().isAlive() && System.nanoTime() < deadline) {
            JsonNode h = health(i);
            if (h != null && role.equals(h.path("leader").path("role").asText())) return true;
            Thread.sleep(50);
        }
        return false;
    }

    Instance leader() {
        for (Instance i : instances) {
            JsonNode h = health(i);
            if (h != null && "leader".equals(h.path("leader").path("role").asText())) return i;
        }
        throw new AssertionError("no instance leads");
    }

    HttpResponse<String> postTo(Instance i, String cluster) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + i.port() + "/api/v1/transitions"))
                .header("Authorization", "Bearer " + token).timeout(Duration.ofSeconds(30))
                .POST(HttpRequest.BodyPublishers.ofString(line(cluster))).build(), HttpResponse.BodyHandlers.ofString());
    }

    static String line(String cluster) {
        return "{\"at\":\"" + Instant.now() + "\",\"cluster\":\"" + cluster + "\",\"node\":\"n1\",\"signal\":\"heartbeat\","
                + "\"state\":\"silent\"}";
    }

    String metrics(Instance i) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + i.port() + "/metrics")).timeout(Duration.ofSeconds(10))
                .build(), HttpResponse.BodyHandlers.ofString()).body();
    }

    static String metricLines(String text) {
        return text.lines().filter(l -> l.startsWith("tend_leader") || l.startsWith("tend_lease_epoch")
                || l.startsWith("tend_takeovers_total") || l.startsWith("tend_standby_journal_lag")).toList().toString();
    }

    static double metricValue(String text, String name) {
        return text.lines().filter(l -> l.startsWith(name + " ")).mapToDouble(l -> Double.parseDouble(l.substring(name.length() + 1)))
                .findFirst().orElse(-1);
    }

    int activeRuns(Instance i) throws Exception {
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + i.port() + "/api/v1/runs?active=true"))
                .header("Authorization", "Bearer " + token).timeout(Duration.ofSeconds(10)).build(), HttpResponse.BodyHandlers.ofString());
        int n = 0;
        for (JsonNode run : JSON.readTree(r.body())) if (!run.path("state").asText().equals("needs-human")) n++;
        return n;
    }
}
