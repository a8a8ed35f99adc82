package dev.tend.stream;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.serve.ServeSettings;
import dev.tend.serve.TendServer;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import dev.tend.testing.InProcessKafka;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.BooleanSupplier;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code tend serve --kafka}: a real broker from Kafka's test kit in this JVM, a real SQLite
 * store, the server consuming. Each record is journaled exactly once although the consumer
 * stops mid-stream and starts again; a bad record is refused on the record (naming its
 * partition and offset) and the records after it are consumed; partitions added to the topic
 * while it reads are found and read from their start.
 */
class KafkaIngestTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");
    /** Event times well in the past (a late arrival is fine) and one millisecond apart, so each record is known in the journal. */
    private static final Instant BASE = Instant.now().minus(Duration.ofMinutes(30));

    @TempDir
    Path dir;

    static EngineSetup setup() {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        return new EngineSetup(set, set.config(), FleetFile.load(LIBRARY.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.following(Duration.ofMinutes(2)));
    }

    /** Record {@code i}: a heartbeat that clears, on a cluster of the Larkspur fleet, at a time of its own. */
    static String line(int i) {
        return "{\"at\":\"" + BASE.plusMillis(i) + "\",\"cluster\":\"fares-" + (1 + i % 3) + "\",\"node\":\"n1\","
                + "\"signal\":\"heartbeat\",\"state\":\"clear\"}";
    }

    static ServeSettings settings(EngineSetup setup, StreamSource stream, PrintWriter log) {
        return ServeSettings.builder(setup).listen("127.0.0.1", 0).tick(Duration.ofMillis(500)).log(log).stream(stream).build();
    }

    @Test
    void eachRecordIsJournaledExactlyOnceAlthoughTheConsumerStopsMidStreamAndStartsAgain() throws Exception {
        InProcessKafka kafka = InProcessKafka.get();
        String topic = kafka.createTopic("larkspur-health", 3);
        StreamSource stream = new StreamSource(kafka.bootstrap(), topic, "tend");
        int perPartition = 4000;
        for (int p = 0; p < 3; p++) {
            List<String> values = new ArrayList<>();
            for (int i = 0; i < perPartition; i++) values.add(line(p * perPartition + i));
            kafka.send(topic, p, values);
        }
        EngineSetup setup = setup();
        StringWriter log = new StringWriter();
        PrintWriter out = new PrintWriter(log, true);
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            try (TendServer first = TendServer.start(store, settings(setup, stream, out))) {
                // stopped while records are read, handed on and committed
                await(() -> offsetSum(store, topic) >= 300, log);
            }
            long afterStop = offsetSum(store, topic);
            assertThat(afterStop).as("the stop came mid-stream").isLessThan(3L * perPartition);
            assertThat(journaled(store)).as("what the stored offsets count is exactly what the journal holds").hasSize((int) afterStop);
            try (TendServer second = TendServer.start(store, settings(setup, stream, out))) {
                await(() -> offsetSum(store, topic) == 3L * perPartition, log);
            }
            Map<Instant, Integer> times = journaled(store);
            assertThat(times).hasSize(3 * perPartition);
            assertThat(times.values()).as("no record journaled twice").allMatch(n -> n == 1);
            Map<Integer, Long> offsets = store.read(r -> r.streamOffsets(topic));
            assertThat(offsets).containsExactlyInAnyOrderEntriesOf(
                    Map.of(0, (long) perPartition, 1, (long) perPartition, 2, (long) perPartition));
            assertThat(log.toString()).contains("from the stored offsets");
        }
    }

    @Test
    void aBadRecordIsRefusedNamingItsPartitionAndOffsetAndTheRecordsAfterItAreConsumed() throws Exception {
        InProcessKafka kafka = InProcessKafka.get();
        String topic = kafka.createTopic("larkspur-health", 1);
        List<String> values = List.of(
                line(0),
                "not json at all",
                line(2).replace("heartbeat", "heartbeet"),             // a signal tend.yaml does not declare
                line(3).replace(BASE.plusMillis(3).toString(), "2300-01-01T00:00:00Z"), // after the year 2200
                line(4).replace("\"state\":\"clear\"", "\"state\":\"sideways\""),
                line(5));
        kafka.send(topic, 0, values);
        StringWriter log = new StringWriter();
        try (Store store = Store.openSqlite(dir.resolve("tend.db"));
             TendServer server = TendServer.start(store, settings(setup(), new StreamSource(kafka.bootstrap(), topic, "tend"),
                     new PrintWriter(log, true)))) {
            await(() -> offsetSum(store, topic) == values.size(), log);
            assertThat(journaled(store).keySet()).containsExactlyInAnyOrder(BASE, BASE.plusMillis(5));
            List<String> refused = new ArrayList<>();
            store.read(r -> {
                r.forEachLedger(new LedgerFilter(null, null, null, null, "input-refused", null), e -> refused.add(e.entry()));
                return null;
            });
            assertThat(refused).hasSize(4);
            for (int i = 0; i < 4; i++) {
                assertThat(refused.get(i)).contains("\"from\":\"topic " + topic + " partition 0 offset " + (i + 1) + "\"")
                        .contains("\"by\":\"kafka\"");
            }
            assertThat(refused.get(1)).contains("field 'signal'").contains("heartbeat");
            assertThat(refused.get(2)).contains("field 'at'");
            assertThat(refused.get(3)).contains("field 'state'");
            assertThat(log.toString()).contains("refused the record at topic " + topic + " partition 0 offset 1: ");
            assertThat(server.port()).isPositive();
        }
    }

    @Test
    void partitionsAddedWhileItReadsAreReadFromTheirStart() throws Exception {
        InProcessKafka kafka = InProcessKafka.get();
        String topic = kafka.createTopic("larkspur-health", 1);
        kafka.send(topic, 0, List.of(line(0), line(1)));
        StringWriter log = new StringWriter();
        try (Store store = Store.openSqlite(dir.resolve("tend.db"));
             TendServer server = TendServer.start(store, settings(setup(), new StreamSource(kafka.bootstrap(), topic, "tend"),
                     new PrintWriter(log, true)))) {
            await(() -> offsetSum(store, topic) == 2, log);
            kafka.addPartitions(topic, 3);
            // sent before the consumer looks for new partitions: read from each new partition's start, none skipped
            kafka.send(topic, 1, List.of(line(10), line(11)));
            kafka.send(topic, 2, List.of(line(20)));
            await(() -> offsetSum(store, topic) == 5, log);
            Map<Integer, Long> offsets = store.read(r -> r.streamOffsets(topic));
            assertThat(offsets).containsExactlyInAnyOrderEntriesOf(Map.of(0, 2L, 1, 2L, 2, 1L));
            assertThat(journaled(store)).containsOnlyKeys(BASE, BASE.plusMillis(1), BASE.plusMillis(10), BASE.plusMillis(11),
                    BASE.plusMillis(20)).allSatisfy((at, n) -> assertThat(n).isOne());
            assertThat(server.port()).isPositive();
        }
    }

    static long offsetSum(Store store, String topic) {
        return store.read(r -> r.streamOffsets(topic)).values().stream().mapToLong(Long::longValue).sum();
    }

    /** How many times each event time is in the journal (every record has one of its own). */
    static Map<Instant, Integer> journaled(Store store) {
        Map<Instant, Integer> times = new HashMap<>();
        store.read(r -> {
            r.forEachInput(0, row -> {
                if (row.kind().equals(InputRow.TRANSITION)) times.merge(row.eventAt(), 1, Integer::sum);
            });
            return null;
        });
        return times;
    }

    static void await(BooleanSupplier condition, StringWriter log) throws InterruptedException {
        long deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) throw new AssertionError("not within 60 s; the server's log:\n" + log);
            Thread.sleep(50);
        }
    }
}
