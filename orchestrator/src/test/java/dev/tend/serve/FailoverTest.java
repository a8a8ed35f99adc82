package dev.tend.serve;

import dev.tend.fault.FaultFiles;
import dev.tend.serve.ServeInstances.Instance;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.LedgerVerification;
import dev.tend.store.Store;
import dev.tend.testing.EmbeddedPostgres;
import dev.tend.testing.InProcessKafka;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * Leader and standby on one PostgreSQL (DESIGN.md section 9), as separate {@code tend serve}
 * processes consuming one topic of a real broker (Kafka's test kit, in this JVM on loopback):
 * a storm of transitions produced to the topic, which only the leader consumes, every run's
 * steps calling a loopback receiver that logs idempotency keys, and the leader killed with
 * SIGKILL mid-storm several times (a new standby started each time); then a leader paused
 * with SIGSTOP past its lease and resumed, which must step down and say so. Prints and
 * asserts: each takeover within 15 s of the kill, no step executed under two keys and no
 * key done twice, no produced transition missing from the journal and none journaled twice,
 * each bad record refused exactly once, the fleet cap and the brake never exceeded, and
 * {@code tend audit verify} passing. Runs with {@code -Pfailover}
 * (kills: {@code tend.failover.kills}, 0 in the default build, which skips it).
 */
class FailoverTest {
    static final int KILLS = Integer.getInteger("tend.failover.kills", 0);
    private static final int CLUSTERS = 40;
    private static final int FLEET_CAP = 6;
    private static final String LEASE = "3s";
    private static final String TOKEN = "tok-failover-operator";
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path dir;

    private String url;
    private String user;
    /** The serve processes (created once the database and topic exist). */
    private ServeInstances serves;
    private InProcessKafka kafka;
    /** The test's own view of the shared store (opened first, so it also migrates the database). */
    private Store watch;
    private FailoverStorm storm;

    @Test
    void killedLeadersAreReplacedWithinFifteenSecondsAndNothingIsLostOrDoneTwice() throws Exception {
        assumeTrue(KILLS > 0, "the failover test runs with -Pfailover");
        EmbeddedPostgres pg = EmbeddedPostgres.get();
        url = pg.createDatabase();
        user = pg.user();
        kafka = InProcessKafka.get();
        storm = new FailoverStorm(kafka, CLUSTERS);
        watch = Store.openJdbc(url, user, null);
        try (KeyReceiver receiver = KeyReceiver.start(Duration.ofMillis(400))) {
            writePolicy(receiver.url());
            serves = new ServeInstances(dir, TOKEN, List.of("--playbooks", dir.resolve("policy").toString(),
                    "--fleet", dir.resolve("policy/fleet.yaml").toString(), "--db", url, "--db-user", user,
                    "--tokens", dir.resolve("tokens.yaml").toString(), "--lease", LEASE,
                    "--ledger-key", dir.resolve("ledger.key").toString(), "--snapshot-every", "200",
                    "--kafka", kafka.bootstrap(), "--topic", storm.topic()));
            Instance first = serves.start();
            assertThat(serves.awaitRole(first, "leader", 90)).as(serves.log(first)).isTrue();
            Instance second = serves.start();
            assertThat(serves.awaitRole(second, "standby", 90)).as(serves.log(second)).isTrue();
            // a standby names the leader once it has read the lease (its first look comes right after it starts)
            long seen = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
            while (serves.leaderUrl(second).isEmpty() && System.nanoTime() < seen) Thread.sleep(50);
            HttpResponse<String> refused = serves.postTo(second, "fares-1");
            assertThat(refused.statusCode()).as(refused.body()).isEqualTo(503);
            assertThat(refused.body()).contains("not-leader");
            assertThat(refused.headers().firstValue("X-Tend-Leader")).contains("http://127.0.0.1:" + first.port());

            Random random = new Random(20271202L);
            List<String> silenced = new ArrayList<>();
            for (int c = 1; c <= CLUSTERS; c++) silenced.add("fares-" + c);
            int posted = 0;
            List<Long> takeoverMs = new ArrayList<>();
            List<String> consumedAtKill = new ArrayList<>();
            for (int k = 0; k < KILLS; k++) {
                int until = Math.min(silenced.size(), posted + 2 + random.nextInt(CLUSTERS / (KILLS + 1) + 2));
                long before = storm.consumed(watch);
                java.util.concurrent.CompletableFuture<Void> sending = storm.produce(silenced.subList(posted, until));
                posted = until;
                // killed while the step's records arrive and are consumed: mid-stream
                long target = before + 200 + random.nextInt(800);
                long by = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
                while (storm.consumed(watch) < target && System.nanoTime() < by) Thread.sleep(10);
                Instance leader = serves.leader();
                consumedAtKill.add(storm.consumed(watch) + " of " + storm.produced());
                long killedAt = System.nanoTime();
                leader.process().destroyForcibly(); // SIGKILL
                leader.process().waitFor(30, TimeUnit.SECONDS);
                serves.instances.remove(leader);
                Instance standby = serves.instances.get(0);
                assertThat(serves.awaitRole(standby, "leader", 60)).as(serves.log(standby)).isTrue();
                takeoverMs.add(TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - killedAt));
                Instance fresh = serves.start();
                assertThat(serves.awaitRole(fresh, "standby", 90)).as(serves.log(fresh)).isTrue();
                sending.get(60, TimeUnit.SECONDS);
            }
            storm.produce(silenced.subList(posted, silenced.size())).get(60, TimeUnit.SECONDS);
            posted = silenced.size();
            assertThat(storm.awaitConsumed(watch, Duration.ofSeconds(120))).as("the storm's %d records consumed within 120 s; %s",
                    storm.produced(), serves.log(serves.leader())).isTrue();

            // a leader paused past its lease: the standby takes over; resumed, it cannot commit and says so
            Instance paused = serves.leader();
            Instance other = serves.instances.stream().filter(i -> i != paused).findFirst().orElseThrow();
            ServeInstances.signal("STOP", paused);
            long pausedAt = System.nanoTime();
            assertThat(serves.awaitRole(other, "leader", 60)).as(serves.log(other)).isTrue();
            long pauseTakeoverMs = TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - pausedAt);
            ServeInstances.signal("CONT", paused);
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
            while (!serves.stepsDown(paused) && System.nanoTime() < deadline) Thread.sleep(200);
            String pausedLog = serves.log(paused);
            assertThat(serves.stepsDown(paused)).as(pausedLog).isTrue();

            // the resumed instance may still call itself leader for a moment while it stops: ask the one that took over
            assertThat(serves.awaitRole(other, "leader", 30)).as(serves.log(other)).isTrue();
            Instance last = other;
            // the storm engaged the brake (30 of 40 clusters silent), which holds until a person releases it
            HttpResponse<String> released = serves.http().send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + last.port()
                            + "/api/v1/brake/release")).header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(30))
                    .POST(HttpRequest.BodyPublishers.ofString("{\"reason\":\"storm over\"}")).build(), HttpResponse.BodyHandlers.ofString());
            assertThat(released.statusCode()).as(released.body()).isEqualTo(200);
            deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(180);
            while (serves.activeRuns(last) > 0 && System.nanoTime() < deadline) Thread.sleep(300);
            // the standby answers reads from the shared store; both say who leads in /metrics
            Instance standbyNow = serves.instances.stream().filter(i -> i != last).findFirst().orElseThrow();
            assertThat(serves.awaitRole(standbyNow, "standby", 60)).as(serves.log(standbyNow)).isTrue();
            HttpResponse<String> runsOnStandby = serves.http().send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + standbyNow.port()
                    + "/api/v1/runs")).header("Authorization", "Bearer " + TOKEN).timeout(Duration.ofSeconds(10)).build(),
                    HttpResponse.BodyHandlers.ofString());
            assertThat(runsOnStandby.statusCode()).isEqualTo(200);
            assertThat(JSON.readTree(runsOnStandby.body()).size()).isGreaterThanOrEqualTo(CLUSTERS);
            String leaderMetrics = serves.metrics(last);
            String standbyMetrics = serves.metrics(standbyNow);
            System.out.println("failover: leader metrics " + ServeInstances.metricLines(leaderMetrics) + "; standby " + ServeInstances.metricLines(standbyMetrics));
            assertThat(leaderMetrics).contains("tend_leader 1.0").contains("tend_takeovers_total 1.0");
            assertThat(standbyMetrics).contains("tend_leader 0.0").contains("tend_standby_journal_lag ");
            assertThat(ServeInstances.metricValue(leaderMetrics, "tend_lease_epoch")).isGreaterThanOrEqualTo(KILLS + 2);
            for (Instance i : List.copyOf(serves.instances)) {
                i.process().destroy(); // SIGTERM: a clean stop
                assertThat(i.process().waitFor(60, TimeUnit.SECONDS)).isTrue();
            }

            Figures f = figures(silenced, receiver);
            int audit = auditVerify();
            System.out.println("failover: records consumed when each SIGKILL came: " + consumedAtKill);
            System.out.printf("failover: %d SIGKILLs of the leader, takeover after %s ms (max %d ms), SIGSTOP past the lease: "
                            + "taken over after %d ms, the paused leader stepped down; %d records produced to the topic (%d bad), "
                            + "%d missing from the journal, %d journaled twice, %d bad records refused (%d twice); %d silenced clusters "
                            + "missing; %d runs, %d keys done, %d asked again by key and answered from the log, %d steps done under "
                            + "two keys; at most %d runs at once (cap %d), %d runs started while the brake was engaged; "
                            + "tend audit verify exit %d%n",
                    KILLS, takeoverMs, takeoverMs.stream().mapToLong(Long::longValue).max().orElse(0), pauseTakeoverMs,
                    storm.produced(), storm.bad(), f.records.missing(), f.records.twice(), f.records.refused(), f.records.refusedTwice(),
                    f.missing, f.runs, receiver.done().size(), receiver.repeats(), f.stepsTwice,
                    f.maxActive, FLEET_CAP, f.startsWhileBraked, audit);
            assertThat(takeoverMs).allSatisfy(ms -> assertThat(ms).isLessThan(15_000));
            assertThat(pauseTakeoverMs).isLessThan(15_000);
            assertThat(f.missing).isZero();
            assertThat(f.records.missing()).isZero();
            assertThat(f.records.twice()).isZero();
            assertThat(f.records.refused()).isEqualTo(storm.bad());
            assertThat(f.records.refusedTwice()).isZero();
            assertThat(f.stepsTwice).isZero();
            assertThat(receiver.done()).isNotEmpty();
            assertThat(f.maxActive).isLessThanOrEqualTo(FLEET_CAP);
            assertThat(f.startsWhileBraked).isZero();
            assertThat(f.ledger.ok()).as(f.ledger.reason()).isTrue();
            assertThat(audit).isZero();
        } catch (Throwable t) {
            // what each instance said, killed ones included: the figures alone do not tell why
            for (int n = 1; serves != null && n <= serves.started(); n++) {
                Path err = dir.resolve("tend-" + n + ".err");
                if (!Files.exists(err)) continue;
                List<String> lines = Files.readAllLines(err);
                System.out.println("failover: the log of tend-" + n + " (last 40 lines):");
                lines.subList(Math.max(0, lines.size() - 40), lines.size()).forEach(l -> System.out.println("  " + l));
            }
            throw t;
        } finally {
            if (serves != null) for (Instance i : serves.instances) i.process().destroyForcibly();
            if (watch != null) watch.close();
        }
    }

    /** What the store and the receiver hold after the storm. */
    private record Figures(long missing, FailoverStorm.Check records, int runs, long stepsTwice, int maxActive, int startsWhileBraked,
                           LedgerVerification ledger) {
    }

    private Figures figures(List<String> silenced, KeyReceiver receiver) throws IOException {
        try (Store store = Store.openJdbc(url, user, null)) {
            Set<String> journaled = new HashSet<>();
            store.read(r -> {
                r.forEachInput(0, row -> {
                    if (row.kind().equals("transition") && row.cluster() != null && row.payload().contains("\"silent\"")) {
                        journaled.add(row.cluster());
                    }
                });
                return null;
            });
            long missing = silenced.stream().filter(c -> !journaled.contains(c)).count();
            List<LedgerEntry> entries = new ArrayList<>();
            store.read(r -> {
                r.forEachLedger(new LedgerFilter(null, null, null, null, null, null), entries::add);
                return null;
            });
            Set<String> active = new HashSet<>();
            Set<String> runs = new HashSet<>();
            int maxActive = 0, whileBraked = 0;
            boolean braked = false;
            for (LedgerEntry e : entries) {
                switch (e.kind()) {
                    case "run-started" -> {
                        active.add(e.run());
                        runs.add(e.run());
                        if (braked) whileBraked++;
                        maxActive = Math.max(maxActive, active.size());
                    }
                    case "run-ended" -> active.remove(e.run());
                    case "brake-engaged" -> braked = true;
                    case "brake-released" -> braked = false;
                    default -> {
                    }
                }
            }
            // a key is RUN/STEP/ATTEMPT: a step done under two keys was started again instead of asked again
            Map<String, Set<String>> keysByStep = new TreeMap<>();
            for (String key : receiver.done()) {
                String step = key.substring(0, key.lastIndexOf('/'));
                keysByStep.computeIfAbsent(step, s -> new HashSet<>()).add(key);
            }
            long twice = keysByStep.values().stream().filter(s -> s.size() > 1).count();
            return new Figures(missing, storm.check(store), runs.size(), twice, maxActive, whileBraked, store.read(r -> r.verifyLedger()));
        }
    }


    /** {@code tend audit verify} on the store, as a person would run it; returns its exit code. */
    private int auditVerify() throws Exception {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process p = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"), "dev.tend.cli.TendMain", "audit", "verify",
                "--db", url, "--db-user", user, "--ledger-key", dir.resolve("ledger.key").toString())
                .redirectErrorStream(true).redirectOutput(dir.resolve("audit.out").toFile()).start();
        assertThat(p.waitFor(120, TimeUnit.SECONDS)).isTrue();
        System.out.println("tend audit verify: " + Files.readString(dir.resolve("audit.out")).strip());
        return p.exitValue();
    }

    private void writePolicy(String receiverUrl) throws IOException {
        Path policy = Files.createDirectories(dir.resolve("policy"));
        Files.writeString(policy.resolve("actions.yaml"), """
                actions:
                  fix-by-call:
                    http:
                      url: %s/fix/{cluster}
                      body: { run: "{run}" }
                      timeout: 1m
                      retries: 3
                """.formatted(receiverUrl));
        Files.writeString(policy.resolve("tend.yaml"), """
                defaults:
                  fleet: %d
                  per-zone: 16
                  rate: 1000/1h
                rate: 1000/1h
                brake:
                  engage-at: { clusters: 30 }
                  release-below: { clusters: 20 }
                  auto-release: false
                """.formatted(FLEET_CAP));
        Files.writeString(policy.resolve("fix-heartbeat.yaml"), """
                playbook: fix-heartbeat
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 0s }
                limits: { impaired-fraction: 1.0, keep-replicas: false, keep-quorum: false }
                steps:
                  - { id: first, action: fix-by-call, timeout: 1m }
                  - { id: second, action: fix-by-call, timeout: 1m }
                """);
        Files.writeString(policy.resolve("fleet.yaml"), FaultFiles.fleet("larkspur-failover", "fares", CLUSTERS));
        FaultFiles.writeTokens(dir.resolve("tokens.yaml"), "failover", TOKEN);
        FaultFiles.writeLedgerKey(dir.resolve("ledger.key"), 11);
    }
}
