package dev.tend.serve;

import dev.tend.api.ApiServer;
import dev.tend.api.ServerTls;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.executor.Executor;
import dev.tend.executor.ExecutorRegistry;
import dev.tend.http.OutgoingHttp;
import dev.tend.metrics.TendMetrics;
import dev.tend.metrics.TimedExecutor;
import dev.tend.page.PageDelivery;
import dev.tend.page.Senders;
import dev.tend.runtime.CommitListener;
import dev.tend.runtime.Notifier;
import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.Recovery;
import dev.tend.runtime.QuartzTimers;
import dev.tend.shared.TendException;
import dev.tend.shared.time.Timers;
import dev.tend.store.Store;

import java.io.PrintWriter;
import java.time.Clock;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A running {@code tend serve}: the orchestrator recovered from the store and driven on
 * its own thread with the wall clock, Quartz timers re-armed from what the engine had armed,
 * the command, simulated and http executors, a tick that lets event time follow processing
 * time (sent only when nothing was committed for a tick's length, since any input moves
 * event time), and the HTTP API on top. Processing time is the wall clock unless the settings'
 * {@link TimeScale} accelerates it. The caller owns the store and closes it after this.
 */
public final class TendServer implements AutoCloseable {
    private final Orchestrator orchestrator;
    private final Store store;
    private final Recovery recovery;
    private final QuartzTimers timers;
    private final List<Executor> executors;
    private final Thread driver;
    private final CountDownLatch driverDone = new CountDownLatch(1);
    private final ScheduledExecutorService ticker;
    /** Where the driver's waiting callers are told, a committed batch's in one task (see {@link Orchestrator#answerOn}). */
    private final java.util.concurrent.ExecutorService answering;
    private final ApiServer api;
    private final PageDelivery pages;
    private final ServerTls tls;
    /** Consumes the --topic into the driver; null without one. */
    private final dev.tend.stream.KafkaIngest ingest;
    private final String host;
    /** When the driver last committed a batch: every input moves event time, so a tick is needed only after a quiet spell. */
    private final AtomicLong lastCommitNanos = new AtomicLong(System.nanoTime());
    private volatile Throwable driverFailure;
    private volatile boolean closed;

    private TendServer(Store store, ServeSettings s, Leadership leadership, TendMetrics shared, dev.tend.runtime.JournalTail warm) {
        this.store = store;
        Clock clock = s.timeScale().clock();
        PrintWriter log = s.log();
        TendMetrics metrics = shared != null ? shared : new TendMetrics(store);
        FleetHealthPublisher health = new FleetHealthPublisher(clock, s.timeScale().factor());
        OutgoingHttp http = new OutgoingHttp();
        // every file an outgoing call or a channel needs is read now: a bad one stops tend before it serves
        for (dev.tend.playbooks.ActionDef a : s.setup().playbooks().actions().byId().values()) {
            if (a instanceof dev.tend.playbooks.HttpAction h) http.check(h.client());
        }
        dev.tend.playbooks.Paging paging = s.setup().config().paging();
        Senders senders = Senders.from(paging, http, log);
        if (senders.logOnly()) {
            log.println("tend: warning: no channels are defined in tend.yaml, so pages are written to this log only and reach"
                    + " nobody else; define channels (webhook, email, command) to page people");
            log.flush();
        }
        executors = ExecutorRegistry.build(new ExecutorRegistry.Settings(s.workDir(), s.seed(), s.speedup(), http)).stream()
                .map(e -> (Executor) new TimedExecutor(e, metrics)).toList();
        Map<String, Executor> byKind = ExecutorRegistry.byKind(executors);
        timers = new QuartzTimers();
        Timers engineTimers = s.timeScale().onProcessingTime(timers);
        CommitListener listeners = new CommitListener() {
            @Override
            public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
                lastCommitNanos.set(System.nanoTime());
                metrics.committed(engine, inputs, effects);
                health.committed(engine, inputs, effects);
            }

            @Override
            public void refused(Input input, String reason) {
                metrics.refused(input, reason);
                synchronized (log) {
                    log.println("tend: refused a " + input.kind() + " input: " + reason);
                    log.flush();
                }
            }
        };
        PageDelivery[] pagesRef = new PageDelivery[1];
        Notifier notifier = n -> {
            PageDelivery p = pagesRef[0];
            if (p != null) p.wake();
        };
        orchestrator = new Orchestrator(store, s.setup(), byKind, engineTimers, notifier, clock, listeners, s.snapshots());
        timers.fireInto(key -> orchestrator.submit(new Input.TimerFired(key)));
        if (warm != null) orchestrator.adopt(warm);
        recovery = orchestrator.recover();
        // the driver thread has not started: this thread may still read the engine
        health.publish(orchestrator.engine());
        metrics.observe(orchestrator.engine());
        driver = new Thread(this::drive, "tend-driver");
        driver.start();
        ticker = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "tend-tick");
            t.setDaemon(true);
            return t;
        });
        long tickMs = s.tick().toMillis();
        ticker.scheduleAtFixedRate(() -> {
            if (System.nanoTime() - lastCommitNanos.get() >= TimeUnit.MILLISECONDS.toNanos(tickMs) * 9 / 10) {
                orchestrator.submit(new Input.Tick());
            }
        }, tickMs, tickMs, TimeUnit.MILLISECONDS);
        // the HTTP answers of committed events are written on these threads, not the driver's (DEVELOPERS.md, "Live")
        answering = Executors.newCachedThreadPool(r -> {
            Thread t = new Thread(r, "tend-answer");
            t.setDaemon(true);
            return t;
        });
        orchestrator.answerOn(answering);
        OrchestratorGateway gateway = new OrchestratorGateway(orchestrator, () -> driverDone.getCount() > 0, s.commandTimeout(), ticker, answering);
        try {
            tls = s.tls() == null ? null : ServerTls.watch(s.tls().cert(), s.tls().key(), s.tls().checkEvery(), log);
        } catch (RuntimeException e) {
            stopDriver();
            throw e;
        }
        try {
            api = ApiServer.start(s.host(), s.port(), s.allowHosts(), s.wrongTokens(), tls, new ApiServer.Parts(store, gateway, s.tokens(),
                    leadership == null ? health : () -> health.get().withLeader(leadership.view()), metrics, clock, log,
                    s.setup().playbooks()));
        } catch (RuntimeException e) {
            if (tls != null) tls.close();
            stopDriver();
            throw new TendException("could not listen on " + s.host() + ":" + s.port() + ": " + e.getMessage(), e);
        }
        host = s.host();
        Senders withLink = paging.consoleUrl() != null ? senders : Senders.from(paging.withConsoleUrl(url() + "/"), http, log);
        pages = new PageDelivery(store, withLink, clock, PAGE_FIRST_PAUSE, metrics::pageAttempted);
        pagesRef[0] = pages;
        // this process owns the engine (it opened the store and runs the driver), so it delivers the outbox
        pages.start();
        // and it alone consumes the topic (a standby never builds a server), from the offsets the store keeps
        ingest = s.stream() == null ? null : dev.tend.stream.KafkaIngest.start(s.stream(), store, orchestrator,
                s.setup().config(), clock, metrics, log, () -> driverDone.getCount() > 0);
    }

    /** The pause before a page is tried again after a first failed attempt (it doubles, up to 5 minutes). */
    static final java.time.Duration PAGE_FIRST_PAUSE = java.time.Duration.ofSeconds(5);

    /**
     * Recovers the engine from {@code store} and starts serving. Throws {@link TendException}
     * when the port cannot be bound (nothing keeps running then).
     */
    public static TendServer start(Store store, ServeSettings settings) {
        return new TendServer(store, settings, null, null, null);
    }

    /**
     * Starts leading: as {@link #start}, with the engine {@code warm} a standby kept (null:
     * built from the store), the metrics kept across this instance's roles, and its part
     * shown by the health route. The caller fenced the store with the lease's epoch.
     */
    static TendServer lead(Store store, ServeSettings settings, Leadership leadership, TendMetrics metrics,
                           dev.tend.runtime.JournalTail warm) {
        return new TendServer(store, settings, leadership, metrics, warm);
    }

    private void drive() {
        try {
            orchestrator.runUntil(() -> false);
        } catch (Throwable t) {
            driverFailure = t;
        } finally {
            driverDone.countDown();
        }
    }

    /** The store this server commits to. */
    public Store store() {
        return store;
    }

    public int port() {
        return api.port();
    }

    /** The base URL, e.g. {@code http://127.0.0.1:7420}, or {@code https://...} when serving over TLS. */
    public String url() {
        String h = host.contains(":") ? "[" + host + "]" : host;
        return (tls == null ? "http://" : "https://") + h + ":" + port();
    }

    /**
     * Keys the ledger from now on (DESIGN.md section 6): a checkpoint entry at least once a
     * minute while it grows, and one when the server stops.
     */
    public void checkpointWith(Store store, dev.tend.audit.LedgerKey key) {
        orchestrator.checkpointWith(new dev.tend.audit.CheckpointWriter(store, key, dev.tend.audit.CheckpointWriter.EVERY));
    }

    /**
     * The page outbox's delivery, the one seam that decides whether this process sends pages:
     * started with the server, which owns the engine; stop it when another process takes the
     * engine over, start it again when this one takes it back.
     */
    public PageDelivery pageDelivery() {
        return pages;
    }

    /** What the start found in the store. */
    public Recovery recovery() {
        return recovery;
    }

    /**
     * Blocks until the driver stops: after {@link #close()}, or when a commit failed, in which
     * case the failure is thrown here (as the {@link TendException} the driver stopped with).
     */
    public void awaitStop() throws InterruptedException {
        driverDone.await();
        Throwable t = driverFailure;
        if (t instanceof RuntimeException r) throw r;
        if (t instanceof Error e) throw e;
        if (t != null) throw new TendException("the orchestrator stopped: " + t, t);
    }

    /** Stops serving: the API, the tick, the driver (after its current batch), timers and executors. Idempotent. */
    @Override
    public void close() {
        if (closed) return;
        closed = true;
        if (ingest != null) ingest.close();
        api.close();
        if (tls != null) tls.close();
        stopDriver();
        pages.close();
    }

    private void stopDriver() {
        ticker.shutdownNow();
        orchestrator.stop();
        try {
            if (!driverDone.await(30, TimeUnit.SECONDS)) {
                throw new TendException("the orchestrator did not stop within 30s");
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } finally {
            answering.shutdown(); // after the driver told its last callers (or it tells them itself from now on)
            timers.close();
            for (Executor e : executors) e.close();
        }
    }
}
