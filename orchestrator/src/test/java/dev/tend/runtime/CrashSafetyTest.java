package dev.tend.runtime;

import dev.tend.shared.RunState;
import dev.tend.fault.FaultFiles;
import dev.tend.fault.TendProcess;
import dev.tend.store.LedgerVerification;
import dev.tend.store.RunFilter;
import dev.tend.store.RunRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;


import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Kills {@code tend ingest} with SIGKILL at random moments, restarts it on the same store
 * each time, and checks that nothing was done twice and nothing was lost. The number of
 * kills is the system property {@code tend.crash.kills} (50 in CI).
 */
class CrashSafetyTest {
    private static final int CLUSTERS = 120;
    /** Clusters whose process-down playbook uses the action that cannot be asked again. */
    private static final int PLAIN = 10;

    @TempDir
    Path dir;

    @Test
    void killedAtRandomMomentsNoKeyRunsTwiceEveryRunFinishesOrWaitsForAPersonAndTheLedgerVerifies() throws Exception {
        int kills = Integer.getInteger("tend.crash.kills", 50);
        Path log = dir.resolve("executed.log");
        Files.createFile(log);
        Files.createDirectories(dir.resolve("claims"));
        writeScripts();
        writePolicy();
        Path input = writeInput();
        Path db = dir.resolve("tend.db");
        Random random = new Random(20271114L);
        int killedMidway = 0;
        for (int i = 0; i < kills; i++) {
            long before = Files.size(log);
            Process p = startIngest(input, db, "run-" + i);
            // kill only once the child is visibly at work (or let it finish if nothing is left to do)
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (p.isAlive() && Files.size(log) == before && System.nanoTime() < deadline) Thread.sleep(5);
            if (!p.waitFor(random.nextInt(300), TimeUnit.MILLISECONDS)) {
                p.destroyForcibly(); // SIGKILL on Unix
                killedMidway++;
            }
            p.waitFor(30, TimeUnit.SECONDS);
        }
        Process last = startIngest(input, db, "final");
        assertThat(last.waitFor(120, TimeUnit.SECONDS)).as("the last, unkilled ingest finishes").isTrue();
        assertThat(last.exitValue()).as(Files.readString(dir.resolve("final.err"))).isZero();

        Map<String, Integer> done = FaultFiles.doneKeys(log);
        assertThat(done).as("keys executed to completion").isNotEmpty();
        assertThat(done.values()).as("no key executed to completion twice").allMatch(n -> n == 1);
        try (Store store = Store.openSqlite(db)) {
            List<RunRow> runs = store.read(r -> r.runs(RunFilter.all().withLimit(10_000)));
            StringBuilder holds = new StringBuilder(Files.readString(dir.resolve("final.out")));
            store.read(r -> {
                java.util.Set<String> seen = new java.util.TreeSet<>();
                r.forEachLedger(dev.tend.store.LedgerFilter.all(), e -> {
                    if (e.kind().equals("verdict") || e.kind().startsWith("run-") || e.kind().startsWith("step-")
                            || e.kind().contains("result")) {
                        String k = e.entry().replaceAll("\"at\":\"[^\"]*\"|\"seq\":\\d+|fares-\\d+|r\\d{6}|\\d\\d:\\d\\d:\\d\\d[.0-9]*", "");
                        if (seen.add(k)) holds.append(e.entry()).append('\n');
                    }
                });
                return null;
            });
            assertThat(runs).as(holds.toString()).hasSize(CLUSTERS + PLAIN);
            assertThat(runs).extracting(RunRow::state)
                    .as("every run finished or is waiting for a person")
                    .allMatch(s -> s == RunState.SUCCEEDED || s == RunState.NEEDS_HUMAN);
            // the journal, replayed through a fresh engine, rebuilds exactly the runs the projections show
            dev.tend.engine.EngineSetup setup = new dev.tend.engine.EngineSetup(
                    dev.tend.playbooks.load.PlaybookLoader.load(dir.resolve("policy")),
                    dev.tend.playbooks.load.PlaybookLoader.loadConfig(dir.resolve("policy/tend.yaml")),
                    dev.tend.shared.fleet.FleetFile.load(dir.resolve("policy/fleet.yaml")),
                    dev.tend.engine.BrakeThresholds.from(dev.tend.playbooks.load.PlaybookLoader.loadConfig(dir.resolve("policy/tend.yaml")).brake()),
                    dev.tend.engine.EventTimeMode.eventsOnly());
            dev.tend.engine.Engine replayed = new dev.tend.engine.Engine(setup);
            store.read(r -> {
                r.forEachInput(0, row -> {
                    // progress rows count what ingest read of its file; they are not the engine's inputs
                    if (!row.kind().equals(SourceProgress.KIND)) replayed.handle(InputCodec.decode(row), row.now());
                });
                return null;
            });
            Map<String, String> projected = new HashMap<>();
            for (RunRow r : runs) projected.put(r.runId(), r.state().wireName());
            Map<String, String> rebuilt = new HashMap<>();
            for (dev.tend.engine.RunSnapshot r : replayed.runs()) rebuilt.put(r.runId(), r.state().wireName());
            assertThat(rebuilt).isEqualTo(projected);
            LedgerVerification v = store.read(r -> r.verifyLedger());
            assertThat(v.ok()).as(v.reason()).isTrue();
            System.out.printf("crash test: %d restarts, %d killed mid-way, %d runs (%d succeeded, %d need a person), %d keys done, %d ledger entries%n",
                    kills, killedMidway, runs.size(), runs.stream().filter(r -> r.state() == RunState.SUCCEEDED).count(),
                    runs.stream().filter(r -> r.state() == RunState.NEEDS_HUMAN).count(), done.size(), v.entries());
        }
    }

    private Process startIngest(Path input, Path db, String name) throws IOException {
        return TendProcess.start(dir, name, List.of("ingest", input.toString(), "--playbooks", dir.resolve("policy").toString(),
                "--fleet", dir.resolve("policy/fleet.yaml").toString(), "--db", db.toString()));
    }

    /** Two programs that log each key they run: one de-duplicates by key (idempotent), one does not. */
    private void writeScripts() throws IOException {
        FaultFiles.writeIdempotentScript(dir.resolve("idempotent.sh"));
        Files.writeString(dir.resolve("plain.sh"), """
                key="$1"; log="$2"
                echo "start $key" >> "$log"
                sleep 0.3
                echo "done $key" >> "$log"
                """);
    }

    private void writePolicy() throws IOException {
        Path policy = Files.createDirectories(dir.resolve("policy"));
        String log = dir.resolve("executed.log").toString();
        String claims = dir.resolve("claims").toString();
        Files.writeString(policy.resolve("actions.yaml"), """
                actions:
                  fix-idempotent:
                    command: [sh, %s, "{key}", %s, %s]
                    timeout: 10m
                    idempotent: true
                  fix-plain:
                    command: [sh, %s, "{key}", %s]
                    timeout: 10m
                """.formatted(dir.resolve("idempotent.sh"), log, claims, dir.resolve("plain.sh"), log));
        Files.writeString(policy.resolve("tend.yaml"), FaultFiles.WIDE_OPEN_POLICY);
        for (String signal : List.of("heartbeat", "process-down")) {
            Files.writeString(policy.resolve("fix-" + signal + ".yaml"), """
                    playbook: fix-%1$s
                    version: 1
                    trigger: { signal: %1$s, state: breach, scope: node }
                    limits: { impaired-fraction: 1.0, keep-replicas: false, keep-quorum: false }
                    steps:
                      - { id: first, action: fix-idempotent, timeout: 10m }
                      - { id: second, action: %2$s, timeout: 10m }
                    """.formatted(signal, signal.equals("heartbeat") ? "fix-idempotent" : "fix-plain"));
        }
        Files.writeString(policy.resolve("fleet.yaml"), FaultFiles.fleet("larkspur-crash", "fares", CLUSTERS));
    }

    private Path writeInput() throws IOException {
        StringBuilder sb = new StringBuilder();
        for (int c = 1; c <= CLUSTERS; c++) {
            sb.append("{\"at\":\"2026-03-14T02:").append(String.format("%02d", c % 60)).append(":00Z\",\"cluster\":\"fares-").append(c)
                    .append("\",\"node\":\"n1\",\"signal\":\"heartbeat\",\"state\":\"breach\"}\n");
            if (c <= PLAIN) sb.append("{\"at\":\"2026-03-14T02:").append(String.format("%02d", c % 60)).append(":30Z\",\"cluster\":\"fares-").append(c)
                    .append("\",\"node\":\"n2\",\"signal\":\"process-down\",\"state\":\"breach\"}\n");
        }
        Path input = dir.resolve("input.jsonl");
        Files.writeString(input, sb);
        return input;
    }

}
