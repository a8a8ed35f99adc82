package dev.tend.console;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.cli.TendMain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/** {@code tend demo} as a user starts it: it serves, its printed tokens work, its script plays, and it stops when asked. */
class ConsoleDemoTest {
    private static final Pattern URL = Pattern.compile("console\\s+(http://\\S+)/");
    private static final Pattern LEAD = Pattern.compile("approver and operator \\(demo-lead\\): (\\S+)");
    private static final Pattern VIEWER = Pattern.compile("viewer \\(demo-viewer\\):\\s+(\\S+)");

    private final HttpClient http = HttpClient.newHttpClient();

    @Test
    void demoStartsAnswersHealthWithItsPrintedTokenPlaysItsIncidentsAndStopsWhenAsked() throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CompletableFuture<Integer> demo = CompletableFuture.supplyAsync(() -> TendMain.run(
                new String[]{"demo", "--port", "0", "--speedup", "60", "--for", "20s"},
                new PrintWriter(out, true), new PrintWriter(err, true)));

        String url = await("the console URL is printed", () -> find(URL, out.toString()), demo, err);
        String lead = find(LEAD, out.toString());
        String viewer = find(VIEWER, out.toString());
        assertThat(out.toString()).contains("Larkspur", "invented", "Three things to try", "1. ", "2. ", "3. ");
        // the first tip tells when the approval will wait (it is not there yet when printed), and --for says how it ends
        assertThat(out.toString()).containsPattern("open Approvals: about \\d+ s from now a node of a critical fares cluster"
                + " goes silent and, once tend has confirmed it, waits there for a person")
                .contains("It stops by itself after 20s; stop it earlier with Ctrl-C.");

        HttpResponse<String> health = get(url + "/api/v1/health", lead);
        assertThat(health.statusCode()).as(health.body()).isEqualTo(200);
        JsonNode h = ApiJson.MAPPER.readTree(health.body());
        assertThat(h.get("fleet").asText()).isEqualTo("larkspur");
        assertThat(h.get("clusters").asInt()).isEqualTo(300);
        assertThat(get(url + "/api/v1/health", viewer).statusCode()).isEqualTo(200);
        assertThat(get(url + "/api/v1/health", "not-a-demo-token").statusCode()).isEqualTo(401);
        assertThat(get(url + "/", null).body()).contains("tend console");
        // the viewer may read but not steer
        HttpResponse<String> forged = http.send(HttpRequest.newBuilder(URI.create(url + "/api/v1/brake/engage"))
                .header("Authorization", "Bearer " + viewer).POST(HttpRequest.BodyPublishers.ofString("{\"reason\":\"x\"}")).build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(forged.statusCode()).isEqualTo(403);

        // at 60x the first scripted transition (a silent node, a minute and a half into demo time) arrives within seconds
        await("the incident script sent a transition", () -> {
            JsonNode page = read(get(url + "/api/v1/ledger?kind=transition", lead).body());
            return page.get("entries").size() > 0 ? page.get("entries").get(0).get("cluster").asText() : null;
        }, demo, err);

        // the critical cluster's approval pages the demo's on-call (the log, as nothing else is configured): the fleet page lists it
        String paged = await("the approval was paged", () -> {
            for (JsonNode p : read(get(url + "/api/v1/pages?state=all", viewer).body())) {
                if (p.get("kind").asText().equals("approval-requested")) return p.get("state").asText();
            }
            return null;
        }, demo, err);
        assertThat(paged).isIn("pending", "delivered");

        assertThat(demo.get(30, TimeUnit.SECONDS)).as(err.toString()).isEqualTo(0);
        assertThat(out.toString()).contains("tend demo: stopped");
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "--speedup|0      | --speedup must be from 1 to 10000, got 0.0",
            "--speedup|20000  | --speedup must be from 1 to 10000, got 20000.0",
            "--port|70000     | --port must be from 0 to 65535, got 70000",
            "--for|soon       | --for: a duration looks like 30s, 5m, 6h or 1d, got 'soon'",
            "--listen|localhost | is not HOST:PORT, e.g. 127.0.0.1:7420"})
    void demoRefusesAnOptionOutOfRangeAsAUsageError(String option, String value, String message) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = TendMain.run(new String[]{"demo", option, value.strip()}, new PrintWriter(out, true), new PrintWriter(err, true));
        assertThat(code).isEqualTo(2);
        assertThat(err.toString()).contains(message);
    }

    @Test
    void listenAndPortMeanTheSameInDemoAndServeAndMayNotDisagree() {
        String[][] commands = {{"demo"}, {"serve", "--playbooks", "no-such-dir", "--fleet", "no-such-fleet.yaml"}};
        for (String[] command : commands) {
            StringWriter err = new StringWriter();
            String[] args = java.util.stream.Stream.concat(java.util.Arrays.stream(command),
                    java.util.stream.Stream.of("--listen", "127.0.0.1:7431", "--port", "7432")).toArray(String[]::new);
            int code = TendMain.run(args, new PrintWriter(new StringWriter(), true), new PrintWriter(err, true));
            assertThat(code).as(command[0]).isEqualTo(2);
            assertThat(err.toString()).as(command[0]).contains("--listen 127.0.0.1:7431 and --port 7432 name two ports; give one");
        }
    }

    private HttpResponse<String> get(String url, String token) throws Exception {
        HttpRequest.Builder b = HttpRequest.newBuilder(URI.create(url)).GET();
        if (token != null) b.header("Authorization", "Bearer " + token);
        return http.send(b.build(), HttpResponse.BodyHandlers.ofString());
    }

    private static JsonNode read(String text) {
        try {
            return ApiJson.MAPPER.readTree(text);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    private static String find(Pattern p, String text) {
        Matcher m = p.matcher(text);
        return m.find() ? m.group(1) : null;
    }

    /** Polls {@code what} (the demo's state, not the time) every 50 ms for at most 20 s. */
    private static String await(String what, ThrowingSupplier value, CompletableFuture<Integer> demo, StringWriter err) throws Exception {
        long deadline = System.nanoTime() + Duration.ofSeconds(20).toNanos();
        while (System.nanoTime() < deadline) {
            if (demo.isDone()) throw new AssertionError("tend demo ended (" + demo.get() + ") before " + what + ": " + err);
            String v = value.get();
            if (v != null) return v;
            Thread.sleep(50);
        }
        throw new AssertionError("timed out waiting until " + what + "; stderr: " + err);
    }

    @FunctionalInterface
    private interface ThrowingSupplier {
        String get() throws Exception;
    }
}
