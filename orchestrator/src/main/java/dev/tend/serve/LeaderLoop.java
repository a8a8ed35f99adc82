package dev.tend.serve;

import dev.tend.engine.LedgerKind;
import dev.tend.metrics.TendMetrics;
import dev.tend.runtime.JournalTail;
import dev.tend.runtime.SnapshotCodec;
import dev.tend.store.LeaderLease;
import dev.tend.store.LeaseLostException;
import dev.tend.store.Store;
import dev.tend.store.StoreException;

import java.io.PrintWriter;
import java.time.Clock;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;

/**
 * {@code tend serve} among instances sharing one PostgreSQL store (DESIGN.md section 9):
 * a {@link Standby} until the leader lease lapses, then the leader (a {@link TendServer}
 * started from the standby's warm engine, its store fenced by the lease's epoch, the lease
 * renewed every third of its length), back to standby when the lease is lost. Only the
 * leader performs side effects: executor calls, timers, pages, ticks.
 */
public final class LeaderLoop implements AutoCloseable {
    private final Store store;
    private final ServeSettings settings;
    private final Duration ttl;
    private final Leadership leadership;
    private final TendMetrics metrics;
    private final PrintWriter log;
    private final Consumer<TendServer> onLead;
    private final LeaderLease lease;
    private volatile boolean stopping;
    private volatile TendServer server;
    private volatile Standby standby;
    private volatile long epoch = -1;

    /**
     * @param onLead called once this instance leads, with its server (e.g. to key the ledger)
     */
    public LeaderLoop(Store store, ServeSettings settings, Duration ttl, String instance, String address, Consumer<TendServer> onLead) {
        if (ttl.compareTo(Duration.ofSeconds(1)) < 0) throw new IllegalArgumentException("the lease must last 1s or more, got " + ttl);
        this.store = store;
        this.settings = settings;
        this.ttl = ttl;
        this.leadership = new Leadership(instance, address);
        this.metrics = new TendMetrics(store);
        this.log = settings.log();
        this.onLead = onLead;
        this.lease = store.lease();
    }

    public Leadership leadership() {
        return leadership;
    }

    /** Serves until {@link #close()}: standby, leader, and standby again when the lease is lost. */
    public void run() throws InterruptedException {
        String fingerprint = SnapshotCodec.fingerprint(settings.setup());
        while (!stopping) {
            say("tend: " + leadership.instance() + " starts as a standby: reading the journal, waiting for the leader lease");
            Standby sb = Standby.start(store, settings, leadership, metrics, fingerprint);
            standby = sb;
            long took;
            JournalTail tail;
            try {
                took = sb.follow(lease, ttl, () -> stopping, log);
                tail = sb.tail();
            } finally {
                sb.close();
                standby = null;
            }
            if (took < 0) return;
            lead(took, tail);
        }
    }

    private void lead(long took, JournalTail tail) throws InterruptedException {
        long started = System.nanoTime();
        epoch = took;
        store.fence(took);
        boolean takeover = took > 1;
        leadership.lead(took, takeover);
        if (takeover) metrics.tookOver();
        metrics.leadership(leadership.view());
        Clock clock = settings.timeScale().clock();
        Map<String, Object> fields = new LinkedHashMap<>();
        fields.put("instance", leadership.instance());
        fields.put("address", leadership.address());
        fields.put("epoch", took);
        ScheduledExecutorService renewer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "tend-lease");
            t.setDaemon(true);
            return t;
        });
        TendServer srv = null;
        // renewed from the moment it is held: starting the server may take longer than the lease lasts
        java.util.concurrent.atomic.AtomicBoolean lost = new java.util.concurrent.atomic.AtomicBoolean();
        java.util.concurrent.atomic.AtomicReference<TendServer> running = new java.util.concurrent.atomic.AtomicReference<>();
        long every = Math.max(200, ttl.toMillis() / 3);
        renewer.scheduleWithFixedDelay(() -> renew(took, lost, running), every, every, TimeUnit.MILLISECONDS);
        try {
            store.useTransaction(tx -> tx.appendLedger(clock.instant(), LedgerKind.LEADER_ELECTED.wire(),
                    LedgerKind.LEADER_ELECTED.check(fields)));
            srv = TendServer.lead(store, settings, leadership, metrics, tail);
            server = srv;
            running.set(srv);
            if (lost.get()) srv.close();
            long ms = TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - started);
            say("tend: " + leadership.instance() + " leads (lease epoch " + took + ") at " + leadership.address() + ", "
                    + ms + " ms after taking the lease: " + srv.recovery().describe());
            onLead.accept(srv);
            srv.awaitStop();
        } catch (RuntimeException e) {
            LeaseLostException gone = leaseLost(e);
            if (gone == null) throw e;
            say("tend: " + leadership.instance() + " steps down: " + gone.getMessage());
        } finally {
            renewer.shutdownNow();
            if (srv != null) srv.close();
            server = null;
        }
    }

    private void renew(long took, java.util.concurrent.atomic.AtomicBoolean lost,
                       java.util.concurrent.atomic.AtomicReference<TendServer> running) {
        try {
            if (lease.renew(took, ttl)) return;
            if (lost.compareAndSet(false, true)) {
                say("tend: " + leadership.instance() + " lost the leader lease (epoch " + took + " is no longer current): it "
                        + "stops leading; nothing it has not committed is done");
            }
            TendServer s = running.get();
            if (s != null) s.close();
        } catch (StoreException e) {
            say("tend: could not renew the leader lease, trying again: " + e.getMessage());
        } catch (RuntimeException e) {
            say("tend: renewing the leader lease failed: " + e);
        }
    }

    private static LeaseLostException leaseLost(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) if (t instanceof LeaseLostException l) return l;
        return null;
    }

    private void say(String line) {
        synchronized (log) {
            log.println(line);
            log.flush();
        }
    }

    /** Stops serving: a leader stops its server (a clean stop) and lets the lease lapse at once for a standby. */
    @Override
    public void close() {
        stopping = true;
        TendServer srv = server;
        if (srv != null) {
            srv.close();
            long e = epoch;
            if (e > 0) {
                try {
                    lease.release(e);
                } catch (StoreException ignored) {
                    // the lease then lapses by itself after its length
                }
            }
        }
        Standby sb = standby;
        if (sb != null) sb.close();
    }
}
