package dev.tend.stream;

import dev.tend.engine.LedgerKind;
import dev.tend.metrics.TendMetrics;
import dev.tend.playbooks.TendConfig;
import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.StreamPosition;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.TendException;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.ConsumerRecords;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.common.PartitionInfo;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.errors.WakeupException;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.StringDeserializer;

import java.io.PrintWriter;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.BooleanSupplier;

/**
 * Feeds the driver from a topic: a thin adapter, as the HTTP route is. Each record's value is
 * one wire line; a good one goes to {@link Orchestrator#submitEventAt}, whose commit stores
 * the partition's next offset with the journal rows, and a bad one is refused on the record
 * (the log and an {@code input-refused} ledger entry naming topic, partition and offset,
 * committed with its offset) and reading goes on. The consumer is assigned every partition
 * and seeks to the offsets kept in the store, never to the group's: a new leader, or this one
 * started again after a crash, takes each record exactly once. Runs only where the driver
 * runs (the leader); stopped by {@link #close()}.
 */
public final class KafkaIngest implements AutoCloseable {
    private static final Duration POLL = Duration.ofMillis(200);
    private static final long SLICE_MS = 200;
    /** How often the positions are reported to the group and new partitions looked for. */
    private static final long REPORT_NANOS = TimeUnit.SECONDS.toNanos(5);

    private final StreamSource source;
    private final Store store;
    private final Orchestrator orchestrator;
    private final RecordDecoder decoder;
    private final Clock clock;
    private final TendMetrics metrics;
    private final PrintWriter log;
    private final BooleanSupplier driverRunning;
    private final Thread thread;
    private volatile KafkaConsumer<byte[], String> consumer;
    private volatile boolean closed;

    private KafkaIngest(StreamSource source, Store store, Orchestrator orchestrator, RecordDecoder decoder, Clock clock,
                        TendMetrics metrics, PrintWriter log, BooleanSupplier driverRunning) {
        this.source = source;
        this.store = store;
        this.orchestrator = orchestrator;
        this.decoder = decoder;
        this.clock = clock;
        this.metrics = metrics;
        this.log = log;
        this.driverRunning = driverRunning;
        this.thread = new Thread(this::run, "tend-kafka");
        this.thread.setDaemon(true);
    }

    /**
     * Starts consuming {@code source} into {@code orchestrator} on a thread of its own.
     *
     * @param config        the policy whose live input checks (clock skew, declared signals) each record passes, as over HTTP
     * @param driverRunning false once the driver stopped: reading stops too
     */
    public static KafkaIngest start(StreamSource source, Store store, Orchestrator orchestrator, TendConfig config,
                                    Clock clock, TendMetrics metrics, PrintWriter log, BooleanSupplier driverRunning) {
        RecordDecoder decoder = new RecordDecoder(clock::instant, config.maxSkew(), config.signals());
        KafkaIngest k = new KafkaIngest(source, store, orchestrator, decoder, clock, metrics, log, driverRunning);
        k.thread.start();
        return k;
    }

    private Properties properties() {
        Properties p = new Properties();
        p.put(ConsumerConfig.BOOTSTRAP_SERVERS_CONFIG, source.bootstrap());
        p.put(ConsumerConfig.GROUP_ID_CONFIG, source.group());
        p.put(ConsumerConfig.CLIENT_ID_CONFIG, "tend-" + ProcessHandle.current().pid());
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        // a partition new to the store is read from its start; one whose stored offset was removed by retention, from its oldest record
        p.put(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG, ByteArrayDeserializer.class.getName());
        p.put(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG, StringDeserializer.class.getName());
        return p;
    }

    private void run() {
        say("tend: consuming " + source.describe() + " (group " + source.group() + "), from the offsets kept in " + store.location());
        CompletableFuture<?> last = null;
        while (!closed && driverRunning.getAsBoolean()) {
            try (KafkaConsumer<byte[], String> c = new KafkaConsumer<>(properties())) {
                consumer = c;
                if (closed) return;
                last = consume(c);
            } catch (WakeupException stop) {
                return;
            } catch (DriverGone gone) {
                say("tend: stopped consuming " + source.describe() + ": " + gone.getMessage());
                return;
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException e) {
                if (closed) return;
                say("tend: reading " + source.describe() + " failed, starting again from the stored offsets in 1s: " + e);
                try {
                    // what was handed to the driver is committed (or refused) before the offsets are read again
                    awaitSettled(last);
                    Thread.sleep(1000);
                } catch (InterruptedException | DriverGone stop) {
                    return;
                }
            } finally {
                consumer = null;
            }
        }
    }

    /** Assigns every partition at its stored offset and reads until closed; returns the last event handed on. */
    private CompletableFuture<?> consume(KafkaConsumer<byte[], String> c) throws InterruptedException {
        List<TopicPartition> assigned = assign(c, List.of());
        CompletableFuture<?> last = null;
        long nextReport = System.nanoTime() + REPORT_NANOS;
        while (!closed) {
            if (!driverRunning.getAsBoolean()) throw new DriverGone("the orchestrator stopped");
            ConsumerRecords<byte[], String> records = c.poll(POLL);
            for (ConsumerRecord<byte[], String> r : records) {
                StreamPosition at = new StreamPosition(r.topic(), r.partition(), r.offset());
                RecordDecoder.Decoded d = decoder.decode(r.value(), at);
                metrics.streamRecord(d.input() != null ? "read" : "refused");
                if (d.input() != null) {
                    last = orchestrator.submitEventAt(d.input(), at);
                } else {
                    // refused with its offset only once what came before it is committed, so no record is skipped
                    awaitSettled(last);
                    last = null;
                    refuse(at, d);
                }
            }
            if (!records.isEmpty()) metrics.streamLag(lag(c, assigned));
            if (System.nanoTime() >= nextReport) {
                nextReport = System.nanoTime() + REPORT_NANOS;
                report(c);
                assigned = assign(c, assigned);
            }
        }
        return last;
    }

    /**
     * Assigns the topic's partitions when they differ from {@code current}, each at the offset
     * the store keeps for it (a partition the store has none for: its start). Before records
     * are read, the topic may not exist yet: it is looked for again every second.
     */
    private List<TopicPartition> assign(KafkaConsumer<byte[], String> c, List<TopicPartition> current) throws InterruptedException {
        boolean told = false;
        while (!closed) {
            List<PartitionInfo> infos = c.partitionsFor(source.topic(), Duration.ofSeconds(10));
            List<TopicPartition> parts = new ArrayList<>();
            if (infos != null) for (PartitionInfo i : infos) parts.add(new TopicPartition(i.topic(), i.partition()));
            if (!parts.isEmpty()) {
                if (parts.size() == current.size() && parts.containsAll(current)) return current;
                // only partitions new to the consumer are sought: the others go on from where it reads
                Map<Integer, Long> stored = store.read(r -> r.streamOffsets(source.topic()));
                c.assign(parts);
                for (TopicPartition tp : parts) {
                    if (current.contains(tp)) continue;
                    Long next = stored.get(tp.partition());
                    if (next != null) c.seek(tp, next);
                    else c.seekToBeginning(List.of(tp));
                }
                if (current.isEmpty()) say("tend: reading " + parts.size() + " partition(s) of " + source.describe()
                        + (stored.isEmpty() ? " from their start" : " from the stored offsets " + stored));
                return parts;
            }
            if (!current.isEmpty()) return current;
            if (!told) say("tend: " + source.describe() + " has no partitions yet; looking again every second");
            told = true;
            Thread.sleep(1000);
        }
        return current;
    }

    private void refuse(StreamPosition at, RecordDecoder.Decoded d) {
        Map<String, Object> fields = new LinkedHashMap<>();
        fields.put("input", "record");
        fields.put("by", "kafka");
        fields.put("from", at.describe());
        fields.put("reason", d.reason());
        LedgerDraft entry = new LedgerDraft(clock.instant(), LedgerKind.INPUT_REFUSED.wire(), LedgerKind.INPUT_REFUSED.check(fields));
        store.useTransaction(tx -> {
            tx.appendLedger(List.of(entry));
            tx.putStreamOffset(at.topic(), at.partition(), at.offset() + 1);
        });
        if (d.timeRefusal() != null) metrics.timeRefused(Map.of(d.timeRefusal(), 1L));
        say("tend: refused the record at " + at.describe() + ": " + d.reason());
    }

    /** Waits until {@code f} (an event handed to the driver) is committed or refused; throws {@link DriverGone} if it never will be. */
    private void awaitSettled(CompletableFuture<?> f) throws InterruptedException {
        if (f == null) return;
        while (true) {
            try {
                f.get(SLICE_MS, TimeUnit.MILLISECONDS);
                return;
            } catch (TimeoutException slice) {
                if (!driverRunning.getAsBoolean()) throw new DriverGone("the orchestrator stopped before committing what was read");
            } catch (ExecutionException e) {
                if (e.getCause() instanceof InvalidInputException) return; // refused on the record, with its offset
                throw new DriverGone("the orchestrator could not commit what was read: " + e.getCause().getMessage());
            }
        }
    }

    private long lag(KafkaConsumer<byte[], String> c, List<TopicPartition> parts) {
        long sum = 0;
        for (TopicPartition tp : parts) sum += c.currentLag(tp).orElse(0);
        return sum;
    }

    /** Tells the group the positions the store keeps, so the usual lag tools see them; the store stays the truth. */
    private void report(KafkaConsumer<byte[], String> c) {
        Map<Integer, Long> stored = store.read(r -> r.streamOffsets(source.topic()));
        if (stored.isEmpty()) return;
        Map<TopicPartition, OffsetAndMetadata> offsets = new HashMap<>();
        stored.forEach((p, next) -> offsets.put(new TopicPartition(source.topic(), p), new OffsetAndMetadata(next)));
        c.commitAsync(offsets, (done, failure) -> {
            if (failure != null && !closed) say("tend: could not report the positions to group " + source.group() + ": " + failure.getMessage());
        });
    }

    private void say(String line) {
        synchronized (log) {
            log.println(line);
            log.flush();
        }
    }

    /** Stops reading; what was handed to the driver is committed by it (or not at all). Idempotent. */
    @Override
    public void close() {
        closed = true;
        KafkaConsumer<byte[], String> c = consumer;
        if (c != null) c.wakeup();
        thread.interrupt();
        try {
            thread.join(TimeUnit.SECONDS.toMillis(15));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** The driver will not commit what is handed to it: reading stops. */
    private static final class DriverGone extends TendException {
        DriverGone(String message) {
            super(message);
        }
    }
}
