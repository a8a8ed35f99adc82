package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.cli.TendMain;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.InputRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
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
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The fault suite's wire part: mutated wire lines through {@code ingest}, {@code serve} and
 * {@code replay}; no stack trace, no good line lost, every refused line located. Lines per
 * path: the system property {@code tend.fault.lines} (1,000 in the default build; 21,000 with
 * {@code -Pfault}, 63,000 in all), about a third of them mutated; {@code tend.fault.mutated} is
 * the least number of mutated lines each path must see (6,700 with {@code -Pfault}, so at least
 * 20,100 in all), and a corpus short of it fails. Prints its figures.
 */
class WireFaultTest {
    static final int LINES = Integer.getInteger("tend.fault.lines", 1000);
    static final int MUTATED_AT_LEAST = Integer.getInteger("tend.fault.mutated", 0);
    private static final Path ROOT = root();
    private static final Pattern LOCATED = Pattern.compile("^.+?:\\d+(:\\d+)?: .+");
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    static Path root() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !p.resolve("playbooks/library").toFile().isDirectory()) p = p.getParent();
        if (p == null) throw new IllegalStateException("cannot find the repository root");
        return p;
    }

    private record Ran(int exit, String out, String err) {
    }

    private static Ran tend(String... args) {
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = TendMain.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Ran(code, out.toString(), err.toString());
    }

    private static List<String> libraryClusters() {
        return FleetFile.load(ROOT.resolve("playbooks/library/fleet.yaml")).clusters().stream().map(c -> c.id().value()).toList();
    }

    /** The corpus of one path, refused when it holds fewer mutated lines than the suite promises. */
    private static List<WireMutator.Line> corpus(long seed, List<String> clusters) {
        List<WireMutator.Line> corpus = new WireMutator(seed, clusters).corpus(LINES);
        long mutated = corpus.stream().filter(l -> !l.good()).count();
        assertThat(mutated).as("mutated lines in this path's corpus (tend.fault.mutated)").isGreaterThanOrEqualTo(MUTATED_AT_LEAST);
        return corpus;
    }

    private static Set<String> goodKeys(List<WireMutator.Line> corpus) {
        Set<String> keys = new HashSet<>();
        for (WireMutator.Line l : corpus) if (l.good()) keys.add(l.key());
        return keys;
    }

    private static String key(String payload) throws Exception {
        JsonNode n = JSON.readTree(payload);
        return java.time.Instant.parse(n.path("at").asText()) + "|" + n.path("cluster").asText() + "|" + n.path("node").asText() + "|"
                + n.path("signal").asText() + "|" + n.path("state").asText();
    }

    private static Set<String> journaledKeys(Store store) throws Exception {
        List<String> payloads = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, row -> {
                if (row.kind().equals(InputRow.TRANSITION)) payloads.add(row.payload());
            });
            return null;
        });
        Set<String> keys = new HashSet<>();
        for (String p : payloads) keys.add(key(p));
        return keys;
    }

    /** No line of {@code text} is a stack trace's or names a Java failure. */
    private static void assertNoTrace(String text) {
        List<String> traces = text.lines().filter(l -> l.startsWith("\tat ") || l.contains("Exception") || l.contains("Error:"))
                .map(l -> l.replace('\u0000', '?')).toList();
        assertThat(traces).isEmpty();
    }

    @Test
    void mutatedLinesThroughIngestLoseNoGoodLineAndAreRefusedByNumber() throws Exception {
        List<WireMutator.Line> corpus = corpus(101, libraryClusters());
        Path file = dir.resolve("mutated.jsonl");
        Files.write(file, WireMutator.join(corpus));
        Path db = dir.resolve("ingest.db");
        Ran r = tend("ingest", file.toString(), "--playbooks", ROOT.resolve("playbooks/library").toString(),
                "--fleet", ROOT.resolve("playbooks/library/fleet.yaml").toString(), "--db", db.toString());
        assertThat(r.exit()).as(r.err().replace((char) 0, (char) 63)).isIn(0, 1);
        assertNoTrace(r.err());
        long skipped = r.err().lines().filter(l -> l.endsWith("(line skipped)")).count();
        long refused = r.err().lines().filter(l -> l.contains(" (a ledger entry input-refused names it): ")).count();
        long unlocated = r.err().lines().filter(l -> (l.endsWith("(line skipped)") || l.contains(" (a ledger entry input-refused names it): "))
                && !LOCATED.matcher(l).matches()).count();
        Set<String> good = goodKeys(corpus);
        Set<String> journaled;
        try (Store store = Store.openSqlite(db)) {
            journaled = journaledKeys(store);
        }
        long lost = good.stream().filter(k -> !journaled.contains(k)).count();
        System.out.printf("fault suite, ingest: %d lines (%d good, %d mutated), %d refused by line, %d refused at commit,"
                + " %d good lines lost, %d refusals without a location, 0 stack traces%n", corpus.size(), good.size(),
                corpus.size() - good.size(), skipped, refused, lost, unlocated);
        assertThat(lost).isZero();
        assertThat(unlocated).isZero();
        assertThat(skipped + refused).isGreaterThan(0);
    }

    @Test
    void mutatedLinesThroughServeAreNeverAServerErrorAndLoseNoGoodLine() throws Exception {
        serve.start(dir);
        List<WireMutator.Line> corpus = corpus(202, List.of("fares-3", "dispatch-1", "tickets-12"));
        HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
        int chunk = 200, serverErrors = 0, unlocated = 0, refusedLines = 0;
        for (int from = 0; from < corpus.size(); from += chunk) {
            byte[] body = WireMutator.join(corpus.subList(from, Math.min(corpus.size(), from + chunk)));
            HttpResponse<String> resp = http.send(HttpRequest.newBuilder(URI.create(serve.server().url() + "/api/v1/transitions"))
                    .header("Authorization", "Bearer " + ServeFixture.OLGA).timeout(Duration.ofSeconds(60))
                    .POST(HttpRequest.BodyPublishers.ofByteArray(body)).build(), HttpResponse.BodyHandlers.ofString());
            if (resp.statusCode() >= 500) serverErrors++;
            assertThat(resp.statusCode()).as(resp.body()).isIn(200, 207, 400);
            assertNoTrace(resp.body());
            JsonNode j = JSON.readTree(resp.body());
            for (JsonNode p : j.path("problems")) {
                refusedLines++;
                if (p.path("line").asInt() <= 0) unlocated++;
            }
        }
        assertThat(serve.get("/api/v1/brake", ServeFixture.VERA).status()).as("the server still answers").isEqualTo(200);
        Set<String> good = goodKeys(corpus);
        Set<String> journaled = journaledKeys(serve.store());
        long lost = good.stream().filter(k -> !journaled.contains(k)).count();
        System.out.printf("fault suite, serve: %d lines (%d good, %d mutated) in %d requests, %d lines refused, %d good lines lost,"
                + " %d refusals without a line, %d server errors%n", corpus.size(), good.size(),
                corpus.stream().filter(l -> !l.good()).count(), (corpus.size() + chunk - 1) / chunk,
                refusedLines, lost, unlocated, serverErrors);
        assertThat(lost).isZero();
        assertThat(unlocated).isZero();
        assertThat(serverErrors).isZero();
    }

    @Test
    void mutatedLinesThroughReplayAreAllListedAndLoseNoGoodLine() throws Exception {
        List<WireMutator.Line> corpus = corpus(303, libraryClusters());
        Path file = dir.resolve("mutated-replay.jsonl");
        Files.write(file, WireMutator.join(corpus));
        Path report = dir.resolve("report.json");
        Ran r = tend("replay", file.toString(), "--playbooks", ROOT.resolve("playbooks/library").toString(),
                "--fleet", ROOT.resolve("playbooks/library/fleet.yaml").toString(), "--format", "json", "--out", report.toString());
        assertThat(r.exit()).as(r.err().replace((char) 0, (char) 63)).isIn(0, 1);
        assertNoTrace(r.err());
        JsonNode rec = JSON.readTree(Files.readString(report)).get("recording");
        long good = corpus.stream().filter(WireMutator.Line::good).count();
        long unlocated = 0;
        for (JsonNode p : rec.get("bad_line_problems")) if (p.path("line").asInt() <= 0) unlocated++;
        System.out.printf("fault suite, replay: %d lines (%d good, %d mutated), %d events read, %d bad lines listed of %d,"
                + " %d without a line%n", corpus.size(), good, corpus.size() - good, rec.get("events").asLong(), rec.get("bad_line_problems").size(), rec.get("bad_lines").asLong(),
                unlocated);
        assertThat(rec.get("events").asLong()).isGreaterThanOrEqualTo(good);
        assertThat(rec.get("bad_line_problems").size()).isEqualTo(rec.get("bad_lines").asInt());
        assertThat(unlocated).isZero();
    }
}
