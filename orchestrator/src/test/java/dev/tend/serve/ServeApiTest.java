package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;

import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static dev.tend.serve.ServeFixture.awaitTrue;
import static dev.tend.serve.ServeFixture.transition;
import static org.assertj.core.api.Assertions.assertThat;

/** The API's routes on a real server: transitions, runs, exclusions, brake, ledger, health, metrics. */
class ServeApiTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    private String startReplaceRun() {
        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA, transition("dispatch-1", "n2", "heartbeat", "silent"));
        assertThat(r.status()).as(r.text()).isEqualTo(200);
        String[] run = new String[1];
        awaitTrue("a run is executing", Duration.ofSeconds(10), () -> {
            JsonNode runs = serve.get("/api/v1/runs?active=true", VERA).json();
            if (runs.size() == 0 || !runs.get(0).get("state").asText().equals("running")) return false;
            run[0] = runs.get(0).get("run").asText();
            return true;
        });
        return run[0];
    }

    @Test
    void linesAheadOfTheClockOrAfter2200AreRefusedLocatedAndCountedAndAnUnknownNodeIsShownAsSuch() {
        serve.start(dir);
        String ahead = "{\"at\":\"" + Instant.now().plus(Duration.ofHours(1)) + "\",\"cluster\":\"tickets-12\",\"node\":\"n1\","
                + "\"signal\":\"disk-latency\",\"state\":\"breach\"}";
        String typo = "{\"at\":\"2261-03-14T02:17:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n1\",\"signal\":\"disk-latency\",\"state\":\"breach\"}";
        String body = transition("tickets-12", "n9", "disk-latency", "breach") + "\n" + ahead + "\n" + typo + "\n";

        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA, body);

        assertThat(r.status()).as(r.text()).isEqualTo(207);
        assertThat(r.json().get("problems")).extracting(p -> p.get("line").asLong() + " " + p.get("field").asText())
                .containsExactly("2 at", "3 at");
        assertThat(r.json().at("/problems/0/message").asText()).contains("ahead of this clock").contains("max-skew");
        assertThat(r.json().at("/problems/1/message").asText()).contains("2261-03-14T02:17:00Z is after 2200");
        String metrics = serve.get("/metrics", null).text();
        assertThat(metrics).contains("tend_event_time_refused_total{reason=\"ahead-of-clock\"} 1.0")
                .contains("tend_event_time_refused_total{reason=\"after-2200\"} 1.0")
                .contains("tend_event_time_refused_total{reason=\"before-1970\"} 0.0"); // every reason shown, at 0 until one happens
        JsonNode health = serve.get("/api/v1/health", VERA).json();
        assertThat(health.at("/unhealthy_clusters/0/signals/0/node").asText()).isEqualTo("n9");
        assertThat(health.at("/unhealthy_clusters/0/signals/0/unknown_target").asBoolean()).isTrue();
    }

    private JsonNode receipts() {
        return serve.get("/api/v1/ledger?kind=transitions-received&limit=1000", VERA).json().get("entries");
    }

    @Test
    void concurrentOneLineRequestsAreAllCountedInTheReceiptsOfTheirCallers() throws Exception {
        serve.start(dir);
        int threads = 8, each = 25;
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads);
        try {
            List<java.util.concurrent.Future<Integer>> answers = new java.util.ArrayList<>();
            for (int t = 0; t < threads; t++) {
                String token = t % 2 == 0 ? OLGA : ServeFixture.OTTO;
                int me = t;
                answers.add(pool.submit(() -> {
                    int ok = 0;
                    for (int i = 0; i < each; i++) {
                        String node = "n" + (1 + (me + i) % 3);
                        if (serve.post("/api/v1/transitions", token, transition("tickets-12", node, "disk-latency", "clear")).status() == 200) ok++;
                    }
                    return ok;
                }));
            }
            for (java.util.concurrent.Future<Integer> a : answers) assertThat(a.get()).isEqualTo(each);
        } finally {
            pool.shutdownNow();
        }

        // the receipts stay open for a second (ReceiptCloser), then every request is in the ledger
        long requests = (long) threads * each;
        awaitTrue("every request is in a transitions-received entry", Duration.ofSeconds(30), () -> {
            long counted = 0;
            for (JsonNode e : receipts()) counted += e.get("requests").asLong();
            return counted == requests;
        });
        JsonNode received = receipts();
        java.util.Map<String, long[]> by = new java.util.TreeMap<>();
        for (JsonNode e : received) {
            long[] sums = by.computeIfAbsent(e.get("by").asText(), k -> new long[3]);
            sums[0] += e.get("accepted").asLong();
            sums[1] += e.get("requests").asLong();
            sums[2]++;
        }
        long perCaller = (long) threads / 2 * each;
        assertThat(by.keySet()).containsExactly("olga", "otto");
        for (long[] sums : by.values()) {
            assertThat(sums[0]).as("transitions accepted").isEqualTo(perCaller);
            assertThat(sums[1]).as("requests").isEqualTo(perCaller);
            assertThat(sums[2]).as("entries: at most one per request").isBetween(1L, perCaller);
        }
    }

    @Test
    void transitionsAppliesGoodLinesAndAnswersBadOnesWithTheirLineNumbers() {
        serve.start(dir);
        String body = transition("tickets-12", "n1", "disk-latency", "breach") + "\n"
                + "{\"at\":\"yesterday\",\"cluster\":\"tickets-12\",\"signal\":\"x\",\"state\":\"breach\"}\n"
                + "\n"
                + transition("tickets-12", "n2", "disk-latency", "breach") + "\n"
                + "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"tickets 12\",\"signal\":\"x\",\"state\":\"breach\"}\n";

        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA, body);

        assertThat(r.status()).as(r.text()).isEqualTo(207);
        assertThat(r.json().get("accepted").asLong()).isEqualTo(2);
        assertThat(r.json().get("rejected").asLong()).isEqualTo(2);
        assertThat(r.json().get("problems")).extracting(p -> p.get("line").asLong()).containsExactly(2L, 5L);
        assertThat(r.json().get("problems")).extracting(p -> p.get("field").asText()).containsExactly("at", "cluster");
        // committed before the answer: the health view already shows both nodes
        JsonNode health = serve.get("/api/v1/health", VERA).json();
        assertThat(health.get("unhealthy").asInt()).isEqualTo(1);
        assertThat(health.at("/unhealthy_clusters/0/cluster").asText()).isEqualTo("tickets-12");
        assertThat(health.at("/unhealthy_clusters/0/signals")).hasSize(2);
        awaitTrue("the request's receipt is in the ledger", Duration.ofSeconds(30), () -> !receipts().isEmpty());
        JsonNode received = receipts();
        assertThat(received).hasSize(1);
        assertThat(received.get(0).get("by").asText()).isEqualTo("olga");
        assertThat(received.get(0).get("from").asText()).isEqualTo("127.0.0.1");
        assertThat(received.get(0).get("accepted").asInt()).isEqualTo(2);
        assertThat(received.get(0).get("rejected").asInt()).isEqualTo(2);
    }

    @Test
    void transitionsWithNoGoodLineIsABadRequest() {
        serve.start(dir);

        ServeFixture.Response bad = serve.post("/api/v1/transitions", OLGA, "not json\n");
        ServeFixture.Response empty = serve.post("/api/v1/transitions", OLGA, "\n\n");

        assertThat(bad.status()).isEqualTo(400);
        assertThat(bad.json().get("rejected").asLong()).isEqualTo(1);
        assertThat(bad.json().at("/problems/0/line").asLong()).isEqualTo(1);
        assertThat(empty.status()).isEqualTo(400);
        assertThat(empty.json().at("/problems/0/message").asText()).isEqualTo("the body holds no transition or topology event");
    }

    @Test
    void transitionsTakesOnePrettyPrintedObject() {
        serve.start(dir);
        String pretty = "{\n  \"at\": \"" + Instant.now() + "\",\n  \"cluster\": \"tickets-12\",\n  \"node\": \"n3\",\n"
                + "  \"signal\": \"disk-latency\",\n  \"state\": \"breach\"\n}\n";

        ServeFixture.Response r = serve.post("/api/v1/transitions", OLGA, pretty);

        assertThat(r.status()).as(r.text()).isEqualTo(200);
        assertThat(r.json().get("accepted").asLong()).isEqualTo(1);
    }

    @Test
    void healthGroupsUnhealthyClustersByZone() {
        serve.start(dir);
        serve.post("/api/v1/transitions", OLGA, transition("tickets-12", "n1", "disk-latency", "breach"));

        JsonNode h = serve.get("/api/v1/health", VERA).json();

        assertThat(h.get("fleet").asText()).isEqualTo("larkspur-test");
        assertThat(h.get("clusters").asInt()).isEqualTo(3);
        assertThat(h.get("zones")).extracting(z -> z.get("zone").asText()).containsExactly("z-a", "z-b", "z-c");
        JsonNode zb = h.get("zones").get(1);
        assertThat(zb.get("clusters").asInt()).isEqualTo(3);
        // the zone's own nodes: each of the three clusters has one node in z-b
        assertThat(zb.get("nodes").asInt()).isEqualTo(3);
        assertThat(h.get("time_scale").asDouble()).as("processing time is the wall clock").isEqualTo(1.0);
        assertThat(zb.get("unhealthy")).extracting(JsonNode::asText).containsExactly("tickets-12"); // tickets-12/n1 is in z-b
        assertThat(h.get("zones").get(0).get("unhealthy")).isEmpty();
        assertThat(h.at("/unhealthy_clusters/0/signals/0/signal").asText()).isEqualTo("disk-latency");
        assertThat(h.at("/brake/engaged").asBoolean()).isFalse();
    }

    @Test
    void anOperatorAbortsARunAndTheLedgerSaysWhoAndFromWhere() {
        serve.start(dir);
        String run = startReplaceRun();

        ServeFixture.Response r = serve.post("/api/v1/runs/" + run + "/abort", OLGA, "{\"reason\":\"owner is on it\"}");
        ServeFixture.Response again = serve.post("/api/v1/runs/" + run + "/abort", OLGA, "{}");

        assertThat(r.status()).as(r.text()).isEqualTo(200);
        assertThat(r.json().get("state").asText()).isEqualTo("cancelled");
        assertThat(r.json().get("outcome").asText()).isEqualTo("aborted by olga: owner is on it");
        assertThat(again.status()).isEqualTo(409);
        assertThat(again.json().get("message").asText()).isEqualTo("run " + run + " already ended: cancelled");
        JsonNode cmd = serve.get("/api/v1/ledger?kind=operator-command&run=" + run, VERA).json().get("entries");
        assertThat(cmd).hasSize(1);
        assertThat(cmd.get(0).get("by").asText()).isEqualTo("olga");
        assertThat(cmd.get(0).get("from").asText()).isEqualTo("127.0.0.1");
        assertThat(serve.get("/api/v1/runs/r424242", VERA).status()).isEqualTo(404);
    }

    @Test
    void runsListShowsStepsAndFilters() {
        serve.start(dir);
        String run = startReplaceRun();

        JsonNode one = serve.run(run);
        JsonNode byCluster = serve.get("/api/v1/runs?cluster=dispatch-1", VERA).json();
        JsonNode other = serve.get("/api/v1/runs?cluster=fares-3", VERA).json();
        ServeFixture.Response badLimit = serve.get("/api/v1/runs?limit=0", VERA);

        assertThat(one.get("playbook").asText()).isEqualTo("replace-standard");
        assertThat(one.get("node").asText()).isEqualTo("n2");
        assertThat(one.at("/steps/0/step").asText()).isEqualTo("replace");
        assertThat(one.at("/steps/0/state").asText()).isEqualTo("running");
        assertThat(byCluster).hasSize(1);
        assertThat(other).isEmpty();
        assertThat(badLimit.status()).isEqualTo(400);
        assertThat(badLimit.json().get("message").asText()).isEqualTo("limit must be a whole number from 1 to 1000, got '0'");
    }

    @Test
    void anExclusionDeniesRunsOnItsClusterUntilRemoved() {
        serve.start(dir);
        String until = Instant.now().plus(Duration.ofHours(4)).toString();

        ServeFixture.Response added = serve.post("/api/v1/exclusions", OLGA, "{\"cluster\":\"dispatch-1\",\"reason\":\"owner"
                + " migrating storage\",\"owner\":\"team-operations\",\"until\":\"" + until + "\"}");
        serve.post("/api/v1/transitions", OLGA, transition("dispatch-1", "n2", "heartbeat", "silent"));

        assertThat(added.status()).as(added.text()).isEqualTo(201);
        assertThat(added.json().get("owner").asText()).isEqualTo("team-operations");
        assertThat(added.json().get("active").asBoolean()).isTrue();
        assertThat(serve.get("/api/v1/exclusions", VERA).json()).hasSize(1);
        JsonNode verdict = serve.get("/api/v1/ledger?kind=verdict&cluster=dispatch-1", VERA).json().get("entries").get(0);
        assertThat(verdict.get("verdict").asText()).isEqualTo("deny");
        assertThat(verdict.get("reasons")).extracting(JsonNode::asText).contains("excluded");
        JsonNode added1 = serve.get("/api/v1/ledger?kind=exclusion-added", VERA).json().get("entries").get(0);
        assertThat(added1.get("by").asText()).isEqualTo("olga");
        assertThat(added1.get("from").asText()).isEqualTo("127.0.0.1");

        ServeFixture.Response removed = serve.delete("/api/v1/exclusions/dispatch-1", OLGA);
        ServeFixture.Response again = serve.delete("/api/v1/exclusions/dispatch-1", OLGA);

        assertThat(removed.status()).as(removed.text()).isEqualTo(200);
        assertThat(serve.get("/api/v1/exclusions", VERA).json()).isEmpty();
        assertThat(again.status()).isEqualTo(404);
        assertThat(again.json().get("message").asText()).isEqualTo("dispatch-1 is not excluded");
    }

    @Test
    void exclusionRequestsAreValidated() {
        serve.start(dir);

        ServeFixture.Response noReason = serve.post("/api/v1/exclusions", OLGA, "{\"cluster\":\"fares-3\",\"owner\":\"o\"}");
        ServeFixture.Response badNode = serve.post("/api/v1/exclusions", OLGA,
                "{\"cluster\":\"fares-3\",\"node\":\"n 2\",\"reason\":\"r\",\"owner\":\"o\"}");
        ServeFixture.Response past = serve.post("/api/v1/exclusions", OLGA,
                "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\",\"until\":\"2020-01-01T00:00:00Z\"}");
        ServeFixture.Response notATime = serve.post("/api/v1/exclusions", OLGA,
                "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\",\"until\":\"tomorrow\"}");
        ServeFixture.Response notJson = serve.post("/api/v1/exclusions", OLGA, "{cluster");

        assertThat(noReason.status()).isEqualTo(400);
        assertThat(noReason.json().get("message").asText()).isEqualTo("reason is required");
        assertThat(badNode.json().get("message").asText())
                .isEqualTo("node: 'n 2' is not an id: use letters, digits and . _ : - only, starting with a letter or digit");
        assertThat(past.json().get("message").asText()).startsWith("until must be at least 1 minute from now (");
        assertThat(notATime.status()).isEqualTo(400);
        assertThat(notATime.json().at("/problems/0/field").asText()).isEqualTo("until");
        assertThat(notJson.status()).isEqualTo(400);
        assertThat(notJson.json().get("message").asText()).startsWith("the body is not JSON");
        assertThat(serve.get("/api/v1/exclusions", VERA).json()).isEmpty();
    }

    @Test
    void releasingABrakeThatIsNotEngagedIsRefused() {
        serve.start(dir);

        ServeFixture.Response r = serve.post("/api/v1/brake/release", OLGA, "{\"reason\":\"just in case\"}");
        ServeFixture.Response noReason = serve.post("/api/v1/brake/engage", OLGA, "");

        assertThat(r.status()).isEqualTo(409);
        assertThat(r.json().get("message").asText()).isEqualTo("the fleet brake is not engaged; nothing was released");
        assertThat(noReason.status()).isEqualTo(400);
        assertThat(serve.get("/api/v1/brake", VERA).json().get("engaged").asBoolean()).isFalse();
    }

    @Test
    void ledgerAnswersTheNewestEntriesOldestFirstWithTheFiltersOfAudit() {
        serve.start(dir);
        for (int i = 1; i <= 3; i++) serve.post("/api/v1/brake/engage", OLGA, "{\"reason\":\"drill " + i + "\"}");

        JsonNode page = serve.get("/api/v1/ledger?kind=brake-engaged&limit=2", VERA).json();
        ServeFixture.Response badTime = serve.get("/api/v1/ledger?since=yesterday", VERA);
        JsonNode future = serve.get("/api/v1/ledger?since=2200-01-01T00:00:00Z", VERA).json();

        assertThat(page.get("entries")).extracting(e -> e.get("reason").asText()).containsExactly("drill 2", "drill 3");
        assertThat(page.get("truncated").asBoolean()).isTrue();
        assertThat(page.get("head_hash").asText()).hasSize(64);
        assertThat(page.get("entries").get(1).get("hash").asText()).hasSize(64);
        assertThat(badTime.status()).isEqualTo(400);
        assertThat(badTime.json().get("message").asText())
                .isEqualTo("since must be an RFC 3339 time like 2027-03-14T22:00:00Z, got 'yesterday'");
        assertThat(future.get("entries")).as(future.toString()).isEmpty();

        long firstSeq = page.get("entries").get(0).get("seq").asLong();
        JsonNode older = serve.get("/api/v1/ledger?kind=brake-engaged&limit=2&before=" + firstSeq, VERA).json();
        assertThat(older.get("entries")).extracting(e -> e.get("reason").asText()).containsExactly("drill 1");
        assertThat(older.get("truncated").asBoolean()).isFalse();
        ServeFixture.Response badBefore = serve.get("/api/v1/ledger?before=-3", VERA);
        assertThat(badBefore.status()).isEqualTo(400);
        assertThat(badBefore.json().get("message").asText())
                .isEqualTo("before must be an entry's seq (a whole number, 1 or more), got '-3'");
    }

    @Test
    void meNamesTheCallerAndTheirRoles() {
        serve.start(dir);

        JsonNode me = serve.get("/api/v1/me", ServeFixture.OTTO).json();

        assertThat(me.get("name").asText()).isEqualTo("otto");
        assertThat(me.get("roles")).extracting(JsonNode::asText).containsExactly("approver", "operator");
    }

    @Test
    void metricsAreInThePrometheusTextFormat() {
        serve.start(dir);
        startReplaceRun();
        serve.post("/api/v1/transitions", OLGA, "garbage\n" + transition("fares-3", "n1", "process-down", "breach"));
        String approved = serve.awaitPendingApproval();
        serve.post("/api/v1/approvals/" + approved + "/approve", ServeFixture.ANNA, "");
        awaitTrue("the approved run succeeded", Duration.ofSeconds(10),
                () -> serve.run(approved).get("state").asText().equals("succeeded"));
        // the figures are taken on the driver thread right after the commit the run's state is read from
        awaitTrue("the metrics show the run ended", Duration.ofSeconds(10),
                () -> serve.get("/metrics", null).text().contains("tend_runs_ended_total{playbook=\"restart-critical\",state=\"succeeded\"} 1.0"));

        ServeFixture.Response m = serve.get("/metrics", null);

        assertThat(m.status()).isEqualTo(200);
        // Prometheus text exposition format 0.0.4: "# TYPE name type" lines, then samples (from memory)
        assertThat(m.text()).contains("# TYPE tend_transitions_received_total counter",
                "tend_transitions_received_total 2.0", "tend_transition_lines_rejected_total 1.0",
                "tend_verdicts_total{reason=\"none\",verdict=\"start\"} 2.0",
                "tend_verdicts_total{reason=\"approval-required\",verdict=\"await-approval\"} 1.0",
                "tend_runs_started_total{playbook=\"replace-standard\"} 1.0",
                "tend_runs_ended_total{playbook=\"restart-critical\",state=\"succeeded\"} 1.0",
                "tend_runs_active 1.0", "tend_fleet_brake_engaged 0.0", "# TYPE tend_ledger_entries gauge",
                "tend_approvals_pending 0.0", "# TYPE tend_executor_duration_seconds histogram",
                "tend_executor_duration_seconds_count{kind=\"simulated\",success=\"true\"} 1");
    }

    @Test
    void unknownApiPathsAnswerWithAJsonError() {
        serve.start(dir);

        ServeFixture.Response r = serve.get("/api/v1/nothing-here", VERA);

        assertThat(r.status()).isEqualTo(404);
        assertThat(r.json().get("error").asText()).isEqualTo("not-found");
    }
}
