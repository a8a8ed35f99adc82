package dev.tend.metrics;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.runtime.CommitListener;
import dev.tend.shared.ApprovalState;
import dev.tend.shared.wire.TimeRefusal;
import dev.tend.store.Store;
import io.prometheus.metrics.core.metrics.Counter;
import io.prometheus.metrics.core.metrics.Gauge;
import io.prometheus.metrics.core.metrics.GaugeWithCallback;
import io.prometheus.metrics.core.metrics.Histogram;
import io.prometheus.metrics.expositionformats.PrometheusTextFormatWriter;
import io.prometheus.metrics.model.registry.PrometheusRegistry;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.List;
import java.util.Map;

/**
 * The metrics of one {@code tend serve}, in a registry of their own (several servers may
 * share a JVM in tests). Counters count from this process's start, as Prometheus expects:
 * <pre>
 * tend_transitions_received_total           transitions and topology events accepted over HTTP
 * tend_transition_lines_rejected_total      lines of transition requests refused
 * tend_event_time_refused_total{reason}     of those, refused for their time: before-1970, after-2200, ahead-of-clock, outside-recording
 * tend_inputs_refused_total{input}          inputs refused at commit (a value the store or engine cannot hold)
 * tend_verdicts_total{verdict,reason}       verdicts written to the ledger, once per reason code ("none" for a clean start)
 * tend_runs_started_total{playbook}
 * tend_runs_ended_total{playbook,state}     succeeded, failed, cancelled, shadowed
 * tend_runs_active                          runs executing, paused or waiting for a person
 * tend_fleet_brake_engaged                  1 while the fleet brake is engaged
 * tend_unhealthy_clusters
 * tend_approvals_pending                    read from the store at scrape time
 * tend_ledger_entries                       the ledger's length, read from the store at scrape time
 * tend_executor_duration_seconds{kind,success}  from call to result
 * tend_notifications_total{channel,outcome} page delivery attempts: delivered, retry (tried again later), failed (given up)
 * tend_stream_records_total{outcome}        records of the --topic consumed: read (handed to the engine) or refused
 * tend_stream_lag                           records of the --topic not consumed yet, over its partitions
 * </pre>
 * Thread-safe. {@link #committed} runs on the driver thread.
 */
public final class TendMetrics implements CommitListener {
    private final PrometheusRegistry registry = new PrometheusRegistry();
    // counted on every request: no exemplars (tend has no trace to link, and the sampler schedules a task now and then)
    private final Counter transitions = Counter.builder().name("tend_transitions_received_total")
            .help("Transitions and topology events accepted over HTTP").withoutExemplars().register(registry);
    private final Counter rejectedLines = Counter.builder().name("tend_transition_lines_rejected_total")
            .help("Lines of transition requests refused").withoutExemplars().register(registry);
    private final Counter timeRefused = Counter.builder().name("tend_event_time_refused_total")
            .help("Lines refused for their time (before 1970, after 2200, ahead of the clock by more than max-skew)")
            .labelNames("reason").withoutExemplars().register(registry);
    private final Counter refusedInputs = Counter.builder().name("tend_inputs_refused_total")
            .help("Inputs refused because of a value the store or the engine cannot hold").labelNames("input").register(registry);
    private final Counter verdicts = Counter.builder().name("tend_verdicts_total")
            .help("Verdicts written to the ledger, once per reason code").labelNames("verdict", "reason").register(registry);
    private final Counter runsStarted = Counter.builder().name("tend_runs_started_total")
            .help("Runs started").labelNames("playbook").register(registry);
    private final Counter runsEnded = Counter.builder().name("tend_runs_ended_total")
            .help("Runs ended, by final state").labelNames("playbook", "state").register(registry);
    private final Gauge activeRuns = Gauge.builder().name("tend_runs_active")
            .help("Runs executing, paused or waiting for a person").register(registry);
    private final Gauge brake = Gauge.builder().name("tend_fleet_brake_engaged")
            .help("1 while the fleet brake is engaged, else 0").register(registry);
    private final Gauge unhealthy = Gauge.builder().name("tend_unhealthy_clusters")
            .help("Clusters with a signal in breach or silent").register(registry);
    private final Histogram executorSeconds = Histogram.builder().name("tend_executor_duration_seconds")
            .help("Time from an executor call to its result").labelNames("kind", "success")
            .classicUpperBounds(0.01, 0.05, 0.1, 0.5, 1, 5, 10, 30, 60, 300, 900, 1800).classicOnly().register(registry);

    private final Gauge leader = Gauge.builder().name("tend_leader")
            .help("1 while this instance holds the leader lease, else 0").register(registry);
    private final Gauge leaseEpoch = Gauge.builder().name("tend_lease_epoch")
            .help("The leader lease's epoch as this instance last saw it (rises at every takeover)").register(registry);
    private final Counter takeovers = Counter.builder().name("tend_takeovers_total")
            .help("Times this instance took the leader lease over from another instance").register(registry);
    private final Counter streamRecords = Counter.builder().name("tend_stream_records_total")
            .help("Records of the --topic consumed: read (handed to the engine) or refused").labelNames("outcome").register(registry);
    private final Gauge streamLag = Gauge.builder().name("tend_stream_lag")
            .help("Records of the --topic not consumed yet, summed over its partitions").register(registry);
    private final Gauge journalLag = Gauge.builder().name("tend_standby_journal_lag")
            .help("Journaled inputs a standby has not read into its engine yet (0 on the leader)").register(registry);

    private final Counter notifications = Counter.builder().name("tend_notifications_total")
            .help("Page delivery attempts by channel and outcome (delivered, retry, failed)").labelNames("channel", "outcome")
            .register(registry);

    public TendMetrics(Store store) {
        // every reason shown from the start, at 0 until one happens
        for (TimeRefusal r : TimeRefusal.values()) timeRefused.labelValues(r.wireName());
        GaugeWithCallback.builder().name("tend_ledger_entries").help("Entries in the audit ledger")
                .callback(cb -> cb.call(store.read(r -> r.ledgerHead().map(e -> (double) e.seq()).orElse(0.0))))
                .register(registry);
        GaugeWithCallback.builder().name("tend_approvals_pending").help("Approvals waiting for a person")
                .callback(cb -> cb.call(store.read(r -> r.approvals(ApprovalState.PENDING).size())))
                .register(registry);
    }

    /** A page delivery attempt ended: outcome delivered, retry or failed. */
    /** This instance's part among instances sharing one store. */
    public void leadership(dev.tend.api.view.LeaderView v) {
        leader.set(v.role().equals("leader") ? 1 : 0);
        leaseEpoch.set(v.epoch());
        journalLag.set(v.journalLag());
    }

    /** This instance took the lease over from another instance. */
    public void tookOver() {
        takeovers.inc();
    }

    /** One record of the --topic was consumed: outcome read or refused. */
    public void streamRecord(String outcome) {
        streamRecords.labelValues(outcome).inc();
    }

    /** Records of the --topic not consumed yet, as the consumer last saw them. */
    public void streamLag(long records) {
        streamLag.set(records);
    }

    public void pageAttempted(String channel, String outcome) {
        notifications.labelValues(channel, outcome).inc();
    }

    public void transitionsReceived(long n) {
        if (n > 0) transitions.inc(n);
    }

    @Override
    public void refused(Input input, String reason) {
        refusedInputs.labelValues(input.kind()).inc();
    }

    public void linesRejected(long n) {
        if (n > 0) rejectedLines.inc(n);
    }

    /** Counts lines refused for their time, by reason; every reason is shown, at 0 until one happens. */
    public void timeRefused(Map<TimeRefusal, Long> byReason) {
        byReason.forEach((why, n) -> {
            if (n > 0) timeRefused.labelValues(why.wireName()).inc(n);
        });
    }

    public void executorAnswered(String kind, boolean success, Duration took) {
        executorSeconds.labelValues(kind, Boolean.toString(success)).observe(took.toNanos() / 1e9);
    }

    /** Sets the gauges from the engine; on the driver thread (or before it starts). */
    public void observe(Engine engine) {
        activeRuns.set(engine.activeRuns());
        brake.set(engine.brake().engaged() ? 1 : 0);
        unhealthy.set(engine.health().unhealthyClusterCount());
    }

    @Override
    public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
        for (Effect e : effects) {
            if (!(e instanceof Effect.Ledger l)) continue;
            switch (l.type()) {
                case VERDICT -> {
                    String verdict = String.valueOf(l.fields().get("verdict"));
                    Object reasons = l.fields().get("reasons");
                    if (reasons instanceof List<?> list && !list.isEmpty()) {
                        for (Object r : list) verdicts.labelValues(verdict, String.valueOf(r)).inc();
                    } else {
                        verdicts.labelValues(verdict, "none").inc();
                    }
                }
                case RUN_STARTED -> runsStarted.labelValues(String.valueOf(l.fields().get("playbook"))).inc();
                case RUN_ENDED -> runsEnded.labelValues(String.valueOf(l.fields().get("playbook")),
                        String.valueOf(l.fields().get("state"))).inc();
                default -> { }
            }
        }
        observe(engine);
    }

    /** The Prometheus text exposition format (version 0.0.4). */
    public String scrape() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            PrometheusTextFormatWriter.create().write(out, registry.scrape());
        } catch (IOException e) {
            throw new UncheckedIOException("writing to memory failed", e);
        }
        return out.toString(StandardCharsets.UTF_8);
    }

    public static String contentType() {
        return PrometheusTextFormatWriter.CONTENT_TYPE;
    }
}
