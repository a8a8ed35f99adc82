package dev.tend.stream;

import dev.tend.engine.EngineSetup;
import dev.tend.serve.LeaderLoop;
import dev.tend.store.Store;
import dev.tend.testing.EmbeddedPostgres;
import dev.tend.testing.InProcessKafka;
import org.junit.jupiter.api.Test;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.ServerSocket;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Two {@code tend serve --kafka} instances in one JVM on one real PostgreSQL and one real
 * broker: only the leader consumes; the standby reads nothing from the topic until it takes
 * over, then goes on from the offsets the leader stored, so no record is journaled twice or
 * missed. (The failover test does the same with processes and SIGKILL.)
 */
class KafkaLeaderTest {
    @Test
    void onlyTheLeaderConsumesAndTheNextLeaderGoesOnFromTheStoredOffsets() throws Exception {
        EmbeddedPostgres pg = EmbeddedPostgres.get();
        String url = pg.createDatabase();
        InProcessKafka kafka = InProcessKafka.get();
        String topic = kafka.createTopic("larkspur-health", 2);
        StreamSource stream = new StreamSource(kafka.bootstrap(), topic, "tend");
        EngineSetup setup = KafkaIngestTest.setup();
        kafka.send(topic, 0, lines(0, 200));
        kafka.send(topic, 1, lines(200, 400));
        StringWriter logA = new StringWriter(), logB = new StringWriter();
        List<Thread> threads = new ArrayList<>();
        try (Store storeA = Store.openJdbc(url, pg.user(), null); Store storeB = Store.openJdbc(url, pg.user(), null)) {
            LeaderLoop a = new LeaderLoop(storeA, settings(setup, stream, logA), Duration.ofSeconds(2), "a", "http://127.0.0.1:1", s -> { });
            threads.add(start(a));
            KafkaIngestTest.await(() -> a.leadership().leads(), logA);
            LeaderLoop b = new LeaderLoop(storeB, settings(setup, stream, logB), Duration.ofSeconds(2), "b", "http://127.0.0.1:2", s -> { });
            threads.add(start(b));
            try {
                KafkaIngestTest.await(() -> "a".equals(b.leadership().view().leader()), logB);
                KafkaIngestTest.await(() -> KafkaIngestTest.offsetSum(storeA, topic) == 400, logA);
                Thread.sleep(1000); // the standby has had the time to consume, were it to
                assertThat(logB.toString()).as("a standby does not consume").doesNotContain("consuming");
                assertThat(logA.toString()).contains("consuming topic " + topic);

                a.close(); // the lease lapses at once; b takes over
                KafkaIngestTest.await(() -> b.leadership().leads(), logB);
                kafka.send(topic, 0, lines(400, 500));
                kafka.send(topic, 1, lines(500, 600));
                KafkaIngestTest.await(() -> KafkaIngestTest.offsetSum(storeB, topic) == 600, logB);
                assertThat(logB.toString()).contains("from the stored offsets {0=200, 1=200}");
                Map<java.time.Instant, Integer> times = KafkaIngestTest.journaled(storeB);
                assertThat(times).hasSize(600);
                assertThat(times.values()).as("no record journaled twice").allMatch(n -> n == 1);
            } finally {
                a.close();
                b.close();
                for (Thread t : threads) t.join(30_000);
            }
        }
    }

    private static List<String> lines(int from, int to) {
        List<String> out = new ArrayList<>();
        for (int i = from; i < to; i++) out.add(KafkaIngestTest.line(i));
        return out;
    }

    private static dev.tend.serve.ServeSettings settings(EngineSetup setup, StreamSource stream, StringWriter log) throws Exception {
        int port;
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            port = s.getLocalPort();
        }
        return dev.tend.serve.ServeSettings.builder(setup).listen("127.0.0.1", port).tick(Duration.ofMillis(500))
                .log(new PrintWriter(log, true)).stream(stream).build();
    }

    private static Thread start(LeaderLoop loop) {
        Thread t = new Thread(() -> {
            try {
                loop.run();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "leader-loop");
        t.start();
        return t;
    }
}
