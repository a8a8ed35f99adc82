package dev.tend.serve;

import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerFilter;
import dev.tend.store.Store;
import dev.tend.testing.InProcessKafka;

import java.io.IOException;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.CompletableFuture;

/**
 * The failover test's storm through a real broker: transitions produced to a topic in steps
 * (each step: a silence of some clusters, {@link #FILLER} harmless clears, one record that is
 * not a wire line), and what the store shows of them afterwards. Every good record has an
 * event time of its own, so the journal tells each record apart.
 */
final class FailoverStorm {
    /** Records of harmless clears produced beside a step's silences, so a kill lands mid-stream. */
    static final int FILLER = 3000;
    static final int PARTITIONS = 2;
    private static final ObjectMapper JSON = new ObjectMapper();

    private final InProcessKafka kafka;
    private final String topic;
    private final int clusters;
    /** The event time of every good record produced. */
    private final List<Instant> produced = new ArrayList<>();
    private int bad;
    private final Instant base = Instant.now().truncatedTo(java.time.temporal.ChronoUnit.SECONDS);

    FailoverStorm(InProcessKafka kafka, int clusters) {
        this.kafka = kafka;
        this.topic = kafka.createTopic("larkspur-failover", PARTITIONS);
        this.clusters = clusters;
    }

    String topic() {
        return topic;
    }

    /** Records produced so far, good and bad. */
    long produced() {
        return produced.size() + bad;
    }

    int bad() {
        return bad;
    }

    /**
     * Produces a step: a silence of each of {@code silenced} (node n1), {@link #FILLER} clears of
     * nodes n2 and n3, and one bad record, spread over the partitions and sent on another thread.
     */
    CompletableFuture<Void> produce(List<String> silenced) {
        List<List<String>> byPartition = new ArrayList<>();
        for (int p = 0; p < PARTITIONS; p++) byPartition.add(new ArrayList<>());
        int i = 0;
        for (String c : silenced) byPartition.get(i++ % PARTITIONS).add(record(c, "n1", "silent"));
        for (int n = 0; n < FILLER; n++) {
            byPartition.get(n % PARTITIONS).add(record("fares-" + (1 + n % clusters), "n" + (2 + n % 2), "clear"));
        }
        byPartition.get(bad % PARTITIONS).add("{\"at\": not a wire line " + bad + "}");
        bad++;
        return CompletableFuture.runAsync(() -> {
            for (int p = 0; p < PARTITIONS; p++) kafka.send(topic, p, byPartition.get(p));
        });
    }

    private String record(String cluster, String node, String state) {
        Instant at = base.plusMillis(produced.size());
        produced.add(at);
        return "{\"at\":\"" + at + "\",\"cluster\":\"" + cluster + "\",\"node\":\"" + node + "\",\"signal\":\"heartbeat\","
                + "\"state\":\"" + state + "\"}";
    }

    /** Records of the topic journaled or refused so far, as the offsets in {@code store} count them. */
    long consumed(Store store) {
        return store.read(r -> r.streamOffsets(topic)).values().stream().mapToLong(Long::longValue).sum();
    }

    /** Waits until the offsets in {@code store} count every record produced; false when not within {@code limit}. */
    boolean awaitConsumed(Store store, Duration limit) throws InterruptedException {
        long deadline = System.nanoTime() + limit.toNanos();
        while (System.nanoTime() < deadline) {
            if (consumed(store) >= produced()) return true;
            Thread.sleep(200);
        }
        return false;
    }

    /**
     * What the store shows of the records.
     *
     * @param missing      good records whose event time is not in the journal
     * @param twice        event times journaled more than once
     * @param refused      bad records refused (told apart by the position their entry names)
     * @param refusedTwice positions refused more than once
     */
    record Check(long missing, long twice, int refused, long refusedTwice) {
    }

    Check check(Store store) throws IOException {
        Map<Instant, Integer> times = new HashMap<>();
        List<LedgerEntry> refusals = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, row -> {
                if (row.kind().equals("transition")) times.merge(row.eventAt(), 1, Integer::sum);
            });
            r.forEachLedger(new LedgerFilter(null, null, null, null, "input-refused", null), refusals::add);
            return null;
        });
        Set<String> from = new HashSet<>();
        long refusedTwice = 0;
        for (LedgerEntry e : refusals) {
            String at = JSON.readTree(e.entry()).path("from").asText();
            if (at.startsWith("topic " + topic + " ") && !from.add(at)) refusedTwice++;
        }
        long missing = produced.stream().filter(t -> !times.containsKey(t)).count();
        long twice = times.values().stream().filter(n -> n > 1).count();
        return new Check(missing, twice, from.size(), refusedTwice);
    }
}
