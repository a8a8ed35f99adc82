package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.api.auth.Tokens;
import dev.tend.store.LedgerVerification;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
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
            int port = freePort();
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
        int port = freePort();
        Process last = startServe(port, "final");
        assertThat(awaitUp(port, last)).as(Files.readString(dir.resolve("final.err"))).isTrue();
        for (; posted < storm.size(); posted++) assertThat(post(port, storm.get(posted))).isTrue();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (activeRuns(port) > 0 && System.nanoTime() < deadline) Thread.sleep(200);
        last.destroy(); // SIGTERM: a clean stop writes the last checkpoint
        assertThat(last.waitFor(30, TimeUnit.SECONDS)).isTrue();

        Map<String, Integer> done = new HashMap<>();
        for (String line : Files.readAllLines(log, StandardCharsets.UTF_8)) {
            if (line.startsWith("done ")) done.merge(line.substring(5), 1, Integer::sum);
        }
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
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of(java, "-Xmx256m", "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"),
                "dev.tend.cli.TendMain", "serve", "--playbooks", dir.resolve("policy").toString(),
                "--fleet", dir.resolve("policy/fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString(),
                "--tokens", dir.resolve("tokens.yaml").toString(), "--listen", "127.0.0.1:" + port,
                "--ledger-key", dir.resolve("ledger.key").toString()));
        return new ProcessBuilder(cmd).directory(dir.toFile())
                .redirectOutput(dir.resolve(name + ".out").toFile())
                .redirectError(dir.resolve(name + ".err").toFile()).start();
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

    private static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }

    private void writePolicy() throws IOException {
        Path policy = Files.createDirectories(dir.resolve("policy"));
        Files.writeString(dir.resolve("idempotent.sh"), """
                key="$1"; log="$2"; claims="$3"
                claim="$claims/$(printf '%s' "$key" | tr '/' '_')"
                if mkdir "$claim" 2>/dev/null; then
                  echo "start $key" >> "$log"
                  sleep 0.3
                  echo "done $key" >> "$log"
                else
                  i=0
                  while ! grep -qxF "done $key" "$log" && [ $i -lt 1000 ]; do sleep 0.01; i=$((i+1)); done
                fi
                """);
        Files.writeString(policy.resolve("actions.yaml"), """
                actions:
                  fix-idempotent:
                    command: [sh, %s, "{key}", %s, %s]
                    timeout: 10m
                    idempotent: true
                """.formatted(dir.resolve("idempotent.sh"), dir.resolve("executed.log"), dir.resolve("claims")));
        Files.writeString(policy.resolve("tend.yaml"), """
                defaults:
                  fleet: 16
                  per-zone: 16
                  rate: 1000/1h
                rate: 1000/1h
                brake:
                  engage-at: { clusters: 1000 }
                  release-below: { clusters: 500 }
                """);
        Files.writeString(policy.resolve("fix-heartbeat.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 0s }
                limits: { impaired-fraction: 1.0, keep-replicas: false, keep-quorum: false }
                steps:
                  - { id: first, action: fix-idempotent, timeout: 10m }
                  - { id: second, action: fix-idempotent, timeout: 10m }
                """);
        StringBuilder fleet = new StringBuilder("fleet: larkspur-storm\nclusters:\n");
        for (int c = 1; c <= CLUSTERS; c++) {
            fleet.append("  - id: fares-").append(c).append("\n    nodes:\n");
            for (int n = 1; n <= 3; n++) fleet.append("      - { id: n").append(n).append(", zone: z-").append((char) ('a' + n - 1)).append(" }\n");
        }
        Files.writeString(policy.resolve("fleet.yaml"), fleet);
        Files.writeString(dir.resolve("tokens.yaml"), "tokens:\n  - { name: storm, roles: [operator, viewer], sha256: "
                + Tokens.hash(TOKEN) + " }\n");
        byte[] key = new byte[32];
        new Random(5).nextBytes(key);
        Path k = dir.resolve("ledger.key");
        Files.write(k, key);
        Files.setPosixFilePermissions(k, java.nio.file.attribute.PosixFilePermissions.fromString("rw-------"));
    }
}
