package dev.tend.serve;

import dev.tend.fault.FaultFiles;
import dev.tend.fault.TendProcess;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerVerification;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

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
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The fault suite's crash part: {@code tend serve} (a separate process) is killed with
 * SIGKILL at random moments while a storm of transitions arrives over HTTP, and started again
 * on the same store each time. No idempotency key is executed to completion twice, and the
 * ledger verifies with its key. Kills: the system property {@code tend.fault.kills} (4 in the
 * default build, 30 with {@code -Pfault}). Prints its figures.
 */
class ServeStormFaultTest {
    static final int KILLS = Integer.getInteger("tend.fault.kills", 4);
    private static final int CLUSTERS = 40;
    private static final String TOKEN = "tok-storm-operator";
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
            .connectTimeout(Duration.ofSeconds(2)).build();

    @Test
    void killedDuringAStormNoKeyRunsTwiceAndTheLedgerVerifiesWithItsKey() throws Exception {
        writePolicy();
        Path log = dir.resolve("executed.log");
        Files.createFile(log);
        Files.createDirectories(dir.resolve("claims"));
        Random random = new Random(20271202L);
        List<String> storm = new ArrayList<>();
        for (int c = 1; c <= CLUSTERS; c++) storm.add("fares-" + c);
        int posted = 0, killed = 0, refusedWhileDown = 0;
        for (int i = 0; i < KILLS; i++) {
            int port = TendProcess.freePort();
            Process p = startServe(port, "run-" + i);
            if (!awaitUp(port, p)) continue;
            // a slice of the storm, then a kill at a random moment while runs execute
            int until = Math.min(storm.size(), posted + 1 + random.nextInt(CLUSTERS / Math.max(1, KILLS) + 4));
            for (; posted < until; posted++) {
                if (!post(port, storm.get(posted))) {
                    refusedWhileDown++;
                    break;
                }
            }
            Thread.sleep(random.nextInt(600));
            p.destroyForcibly(); // SIGKILL on Unix
            p.waitFor(30, TimeUnit.SECONDS);
            killed++;
        }
        int port = TendProcess.freePort();
        Process last = startServe(port, "final");
        assertThat(awaitUp(port, last)).as(Files.readString(dir.resolve("final.err"))).isTrue();
        for (; posted < storm.size(); posted++) assertThat(post(port, storm.get(posted))).isTrue();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (activeRuns(port) > 0 && System.nanoTime() < deadline) Thread.sleep(200);
        last.destroy(); // SIGTERM: a clean stop writes the last checkpoint
        assertThat(last.waitFor(30, TimeUnit.SECONDS)).isTrue();

        Map<String, Integer> done = FaultFiles.doneKeys(log);
        long twice = done.values().stream().filter(n -> n > 1).count();
        LedgerVerification chain;
        dev.tend.audit.AnchorVerifier.Result keyed;
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            chain = store.read(r -> r.verifyLedger());
            keyed = store.read(r -> dev.tend.audit.AnchorVerifier.verify(r, dev.tend.audit.LedgerKey.load(dir.resolve("ledger.key")), null));
        }
        System.out.printf("fault suite, serve storm: %d SIGKILLs, %d clusters gone silent, %d keys executed, %d executed twice,"
                + " ledger %s (%d entries), with its key: %s%n", killed, storm.size(), done.size(), twice,
                chain.ok() ? "verifies" : "BROKEN", chain.entries(), keyed.message());
        assertThat(killed).as("serve processes killed with SIGKILL (tend.fault.kills)").isEqualTo(KILLS);
        assertThat(done).isNotEmpty();
        assertThat(twice).isZero();
        assertThat(chain.ok()).as(chain.reason()).isTrue();
        assertThat(keyed.ok()).as(keyed.message()).isTrue();
    }

    private Process startServe(int port, String name) throws IOException {
        return TendProcess.start(dir, name, List.of("serve", "--playbooks", dir.resolve("policy").toString(),
                "--fleet", dir.resolve("policy/fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString(),
                "--tokens", dir.resolve("tokens.yaml").toString(), "--listen", "127.0.0.1:" + port,
                "--ledger-key", dir.resolve("ledger.key").toString()));
    }

    private boolean awaitUp(int port, Process p) throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (p.isAlive() && System.nanoTime() < deadline) {
            try {
                HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/me"))
                        .header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(2)).build(), HttpResponse.BodyHandlers.ofString());
                if (r.statusCode() == 200) return true;
            } catch (IOException notYet) {
                // the server is still starting
            }
            Thread.sleep(50);
        }
        return false;
    }

    private boolean post(int port, String cluster) throws InterruptedException {
        String line = "{\"at\":\"" + Instant.now() + "\",\"cluster\":\"" + cluster + "\",\"node\":\"n1\",\"signal\":\"heartbeat\","
                + "\"state\":\"silent\"}";
        try {
            HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/transitions"))
                    .header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(30))
                    .POST(HttpRequest.BodyPublishers.ofString(line)).build(), HttpResponse.BodyHandlers.ofString());
            assertThat(r.statusCode()).as(r.body()).isLessThan(500);
            return r.statusCode() == 200;
        } catch (IOException down) {
            return false;
        }
    }

    private int activeRuns(int port) throws Exception {
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/api/v1/runs?active=true"))
                .header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(10)).build(), HttpResponse.BodyHandlers.ofString());
        JsonNode runs = JSON.readTree(r.body());
        int n = 0;
        for (JsonNode run : runs) if (!run.path("state").asText().equals("needs-human")) n++;
        return n;
    }

    private void writePolicy() throws IOException {
        Path policy = Files.createDirectories(dir.resolve("policy"));
        FaultFiles.writeIdempotentScript(dir.resolve("idempotent.sh"));
        Files.writeString(policy.resolve("actions.yaml"), """
                actions:
                  fix-idempotent:
                    command: [sh, %s, "{key}", %s, %s]
                    timeout: 10m
                    idempotent: true
                """.formatted(dir.resolve("idempotent.sh"), dir.resolve("executed.log"), dir.resolve("claims")));
        Files.writeString(policy.resolve("tend.yaml"), FaultFiles.WIDE_OPEN_POLICY);
        Files.writeString(policy.resolve("fix-heartbeat.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 0s }
                limits: { impaired-fraction: 1.0, keep-replicas: false, keep-quorum: false }
                steps:
                  - { id: first, action: fix-idempotent, timeout: 10m }
                  - { id: second, action: fix-idempotent, timeout: 10m }
                """);
        Files.writeString(policy.resolve("fleet.yaml"), FaultFiles.fleet("larkspur-storm", "fares", CLUSTERS));
        FaultFiles.writeTokens(dir.resolve("tokens.yaml"), "storm", TOKEN);
        FaultFiles.writeLedgerKey(dir.resolve("ledger.key"), 5);
    }
}
