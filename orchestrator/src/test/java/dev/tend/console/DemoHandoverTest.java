package dev.tend.console;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.cli.TendMain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * After a demo in which a person approved the critical run and it ended, {@code tend
 * handover} on the demo's store does not show that approval as pending: the demo's
 * accelerated time runs ahead of the wall clock, and the report's "until now" reaches the
 * ledger's last entry.
 */
class DemoHandoverTest {
    private static final Pattern URL = Pattern.compile("console\\s+(http://\\S+)/");
    private static final Pattern LEAD = Pattern.compile("approver and operator \\(demo-lead\\): (\\S+)");
    private static final Duration WAIT = Duration.ofSeconds(30);

    private final HttpClient http = HttpClient.newHttpClient();

    @TempDir
    Path dir;

    @Test
    void anApprovalThatLaterSucceededIsNotPendingInTheHandoverAfterTheDemo() throws Exception {
        String db = dir.resolve("demo.db").toString();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CompletableFuture<Integer> demo = CompletableFuture.supplyAsync(() -> TendMain.run(
                new String[]{"demo", "--port", "0", "--speedup", "200", "--for", "25s", "--db", db},
                new PrintWriter(out, true), new PrintWriter(err, true)));
        String url = await("the console URL is printed", () -> find(URL, out.toString()), demo, err);
        String lead = find(LEAD, out.toString());

        String run = await("the critical run waits for a person", () -> {
            JsonNode pending = json(get(url + "/api/v1/approvals", lead));
            return pending.size() > 0 ? pending.get(0).get("run").asText() : null;
        }, demo, err);
        HttpResponse<String> approved = http.send(HttpRequest.newBuilder(URI.create(url + "/api/v1/approvals/" + run + "/approve"))
                .header("Authorization", "Bearer " + lead).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString("{}")).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(approved.statusCode()).as(approved.body()).isEqualTo(200);
        // replace-node succeeds 95 times in 100 (playbooks/library/actions.yaml): any end shows the approval settled
        await("the approved run ends", () -> {
            JsonNode r = json(get(url + "/api/v1/runs/" + run, lead));
            return r.hasNonNull("ended_at") ? r.get("state").asText() : null;
        }, demo, err);
        assertThat(demo.get(60, TimeUnit.SECONDS)).as(err.toString()).isZero();

        StringWriter report = new StringWriter();
        StringWriter problems = new StringWriter();
        int code = TendMain.run(new String[]{"handover", "--db", db, "--since", "1d"}, new PrintWriter(report, true),
                new PrintWriter(problems, true));
        assertThat(code).as(problems.toString()).isZero();
        assertThat(report.toString()).as(report.toString()).doesNotContain("approval pending  " + run)
                .contains("Approvals ");
    }

    private String get(String url, String token) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create(url)).header("Authorization", "Bearer " + token).GET().build(),
                HttpResponse.BodyHandlers.ofString()).body();
    }

    private static JsonNode json(String text) throws Exception {
        return ApiJson.MAPPER.readTree(text);
    }

    private static String find(Pattern p, String text) {
        Matcher m = p.matcher(text);
        return m.find() ? m.group(1) : null;
    }

    /** Polls {@code what} (the demo's state, not the time) every 50 ms for at most 30 s. */
    private static String await(String what, ThrowingSupplier value, CompletableFuture<Integer> demo, StringWriter err) throws Exception {
        long deadline = System.nanoTime() + WAIT.toNanos();
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
