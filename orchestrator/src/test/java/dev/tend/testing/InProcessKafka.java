package dev.tend.testing;

import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.serialization.StringSerializer;
import org.apache.kafka.common.test.KafkaClusterTestKit;
import org.apache.kafka.common.test.TestKitNodes;

import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * A real Kafka broker for the orchestrator's tests, from Kafka's own test kit: one combined
 * KRaft node (controller and broker) in this JVM, listening on loopback, started once per
 * test JVM. Each test takes topics of its own.
 */
public final class InProcessKafka {
    private static final AtomicInteger TOPICS = new AtomicInteger();
    private static InProcessKafka instance;

    private final KafkaClusterTestKit cluster;

    private InProcessKafka(KafkaClusterTestKit cluster) {
        this.cluster = cluster;
    }

    /** The broker, started on first use; it stops when the JVM exits. */
    public static synchronized InProcessKafka get() {
        if (instance != null) return instance;
        // Kafka ends its process on a fault it deems fatal (Exit.exit, Exit.halt); in this JVM that
        // would end the test run with a failing exit code after every test passed, so it is told instead
        org.apache.kafka.common.utils.Exit.setExitProcedure((code, message) ->
                System.err.println("the in-process Kafka broker asked to exit (" + code + "): " + message));
        org.apache.kafka.common.utils.Exit.setHaltProcedure((code, message) ->
                System.err.println("the in-process Kafka broker asked to halt (" + code + "): " + message));
        try {
            KafkaClusterTestKit kit = new KafkaClusterTestKit.Builder(new TestKitNodes.Builder()
                    .setCombined(true).setNumBrokerNodes(1).setNumControllerNodes(1).build())
                    // one node: the group and transaction logs cannot have three replicas; no wait for more members
                    .setConfigProp("offsets.topic.replication.factor", "1")
                    .setConfigProp("offsets.topic.num.partitions", "1")
                    .setConfigProp("transaction.state.log.replication.factor", "1")
                    .setConfigProp("transaction.state.log.min.isr", "1")
                    .setConfigProp("group.initial.rebalance.delay.ms", "0")
                    .setConfigProp("auto.create.topics.enable", "false")
                    .build();
            kit.format();
            kit.startup();
            kit.waitForReadyBrokers();
            Runtime.getRuntime().addShutdownHook(new Thread(() -> {
                try {
                    kit.close();
                } catch (Exception ignored) {
                    // the JVM is going away; the log folders are temporary
                }
            }));
            instance = new InProcessKafka(kit);
            return instance;
        } catch (Exception e) {
            throw new IllegalStateException("the in-process Kafka broker did not start: " + e, e);
        }
    }

    /** {@code HOST:PORT} of the broker, on loopback. */
    public String bootstrap() {
        return cluster.bootstrapServers();
    }

    /** Creates a topic of its own for a test, with {@code partitions} partitions, and returns its name. */
    public String createTopic(String prefix, int partitions) {
        String name = prefix + "-" + TOPICS.incrementAndGet();
        try (Admin admin = cluster.admin()) {
            admin.createTopics(List.of(new NewTopic(name, partitions, (short) 1))).all().get(30, TimeUnit.SECONDS);
        } catch (Exception e) {
            throw new IllegalStateException("could not create topic " + name + ": " + e, e);
        }
        return name;
    }

    /** Raises the partitions of {@code topic} to {@code total}, as an operator does while consumers read it. */
    public void addPartitions(String topic, int total) {
        try (Admin admin = cluster.admin()) {
            admin.createPartitions(Map.of(topic, org.apache.kafka.clients.admin.NewPartitions.increaseTo(total))).all()
                    .get(30, TimeUnit.SECONDS);
        } catch (Exception e) {
            throw new IllegalStateException("could not add partitions to " + topic + ": " + e, e);
        }
    }

    /** A producer that waits for the broker's acknowledgement of every record. */
    public KafkaProducer<String, String> producer() {
        Properties p = new Properties();
        p.putAll(Map.of(ProducerConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrap(), ProducerConfig.ACKS_CONFIG, "all",
                ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true", ProducerConfig.LINGER_MS_CONFIG, "5"));
        return new KafkaProducer<>(p, new StringSerializer(), new StringSerializer());
    }

    /** Sends {@code values} to {@code partition} of {@code topic} in order, and waits until all are acknowledged. */
    public void send(String topic, int partition, List<String> values) {
        try (KafkaProducer<String, String> producer = producer()) {
            List<java.util.concurrent.Future<org.apache.kafka.clients.producer.RecordMetadata>> acks = new java.util.ArrayList<>();
            for (String v : values) acks.add(producer.send(new ProducerRecord<>(topic, partition, null, v)));
            producer.flush();
            for (var a : acks) a.get(30, TimeUnit.SECONDS);
        } catch (Exception e) {
            throw new IllegalStateException("could not send to " + topic + ": " + e, e);
        }
    }
}
