package dev.tend.page;

import dev.tend.fault.FaultFiles;
import dev.tend.fault.TendProcess;
import dev.tend.store.LedgerVerification;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A tend process is killed (SIGKILL) after it ledgered a page and while the page is on its
 * way; the next tend on the same store delivers it, and the receiver, dropping repeats by
 * id, takes it once. One page reaches the ledger as delivered.
 */
class PageCrashTest {
    @TempDir
    Path dir;

    @Test
    void aPageLedgeredBeforeAKillIsDeliveredOnceAfterTheRestart() throws Exception {
        try (PageReceiver receiver = PageReceiver.http().holdRequests()) {
            writePolicy(receiver.url());
            Path storm = dir.resolve("storm.jsonl");
            Files.writeString(storm, """
                    {"at":"2026-03-14T02:00:00Z","cluster":"fares-1","node":"n1","signal":"heartbeat","state":"silent"}
                    {"at":"2026-03-14T02:00:05Z","cluster":"fares-2","node":"n1","signal":"heartbeat","state":"silent"}
                    """);
            Process first = ingest(storm, "first");
            try {
                Outboxes.await("the page on its way", Duration.ofSeconds(60), () -> !receiver.requests().isEmpty());
            } finally {
                first.destroyForcibly(); // SIGKILL on Unix: no shutdown hook, no last record
                first.waitFor(30, TimeUnit.SECONDS);
            }
            try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
                PageRow row = Outboxes.row(store, "brake/1");
                assertThat(row.state()).as("ledgered and in the outbox, not yet recorded as delivered").isEqualTo(PageRow.PENDING);
                assertThat(row.attempts()).isZero();
                assertThat(Outboxes.ledger(store, "notification")).hasSize(1);
                assertThat(Outboxes.ledger(store, "notification-delivered")).isEmpty();
            }

            receiver.release(); // the receiver took the first copy, though nobody heard its answer
            Path nothing = dir.resolve("nothing.jsonl");
            Files.writeString(nothing, "");
            Process second = ingest(nothing, "second");
            assertThat(second.waitFor(120, TimeUnit.SECONDS)).as("the restarted ingest ends").isTrue();
            assertThat(second.exitValue()).as(Files.readString(dir.resolve("second.err"))).isZero();

            assertThat(receiver.requests()).extracting(PageReceiver.Request::key).containsExactly("brake/1", "brake/1");
            assertThat(receiver.accepted()).containsExactly(java.util.Map.entry("brake/1", 1));
            try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
                assertThat(Outboxes.row(store, "brake/1").state()).isEqualTo(PageRow.DELIVERED);
                assertThat(Outboxes.ledger(store, "notification")).as("the restart replayed the journal; no second page").hasSize(1);
                assertThat(Outboxes.ledger(store, "notification-delivered")).singleElement()
                        .satisfies(d -> assertThat(d.get("answer").asText()).isEqualTo("HTTP 200: duplicate"));
                LedgerVerification v = store.read(r -> r.verifyLedger());
                assertThat(v.ok()).as(v.toString()).isTrue();
            }
        }
    }

    private Process ingest(Path input, String name) throws IOException {
        return TendProcess.start(dir, name, List.of("ingest", input.toString(), "--playbooks", dir.resolve("policy").toString(),
                "--fleet", dir.resolve("policy/fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString()));
    }

    private void writePolicy(String url) throws IOException {
        Path policy = Files.createDirectories(dir.resolve("policy"));
        FaultFiles.writeReplacePolicy(policy, """
                brake:
                  engage-at: { clusters: 2 }
                  release-below: { clusters: 1 }
                channels:
                  oncall:
                    webhook: { url: "%s", retries: 0, timeout: 60s }
                pages:
                  brake-gather: 0s
                """.formatted(url), "1s", "5m", "10m");
        Files.writeString(policy.resolve("fleet.yaml"), FaultFiles.fleet("larkspur-crash", "fares", 4));
    }
}
