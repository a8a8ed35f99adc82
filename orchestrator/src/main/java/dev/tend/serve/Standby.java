package dev.tend.serve;

import dev.tend.api.ApiServer;
import dev.tend.api.Gateway;
import dev.tend.api.NotLeaderException;
import dev.tend.api.ServerTls;
import dev.tend.api.view.LeaderView;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.metrics.TendMetrics;
import dev.tend.runtime.JournalTail;
import dev.tend.shared.TendException;
import dev.tend.store.LeaderLease;
import dev.tend.store.LeaseRow;
import dev.tend.store.Store;
import dev.tend.store.StoreException;
import dev.tend.store.StoreReader;

import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.OptionalLong;
import java.util.function.BooleanSupplier;

/**
 * A standby {@code tend serve} on a shared PostgreSQL store: it keeps a warm engine by
 * reading what the leader journals (after the newest snapshot), answers the API's read
 * routes from the store and that engine, refuses writes with the leader's address, and
 * watches the leader lease, taking it once it lapsed. It performs no side effect: no
 * executor call, timer, page or tick.
 */
final class Standby implements AutoCloseable {
    /** How often the journal and the lease are looked at. */
    static final Duration POLL = Duration.ofMillis(250);

    private final Store store;
    private final Leadership leadership;
    private final TendMetrics metrics;
    private final JournalTail tail;
    private final FleetHealthPublisher health;
    private final ApiServer api;
    private final ServerTls tls;

    private Standby(Store store, ServeSettings s, Leadership leadership, TendMetrics metrics, JournalTail tail) {
        this.store = store;
        this.leadership = leadership;
        this.metrics = metrics;
        this.tail = tail;
        Clock clock = s.timeScale().clock();
        this.health = new FleetHealthPublisher(clock, s.timeScale().factor());
        tail.catchUp();
        health.publish(tail.engine());
        metrics.observe(tail.engine());
        Gateway refuse = new Gateway() {
            @Override
            public List<Effect> command(Input.Command command) {
                throw notLeader();
            }

            @Override
            public void events(List<Input> events, dev.tend.store.LedgerDraft receipt) {
                throw notLeader();
            }
        };
        tls = s.tls() == null ? null : ServerTls.watch(s.tls().cert(), s.tls().key(), s.tls().checkEvery(), s.log());
        try {
            api = ApiServer.start(s.host(), s.port(), s.allowHosts(), s.wrongTokens(), tls, new ApiServer.Parts(store, refuse, s.tokens(),
                    () -> health.get().withLeader(leadership.view()), metrics, clock, s.log(), s.setup().playbooks()));
        } catch (RuntimeException e) {
            if (tls != null) tls.close();
            throw new TendException("could not listen on " + s.host() + ":" + s.port() + ": " + e.getMessage(), e);
        }
    }

    /** Builds the warm engine from {@code store} and starts answering on the settings' address. */
    static Standby start(Store store, ServeSettings s, Leadership leadership, TendMetrics metrics, String fingerprint) {
        return new Standby(store, s, leadership, metrics, JournalTail.open(store, s.setup(), fingerprint));
    }

    private NotLeaderException notLeader() {
        LeaderView v = leadership.view();
        String where = v.leaderUrl() == null ? "no instance leads at the moment (a takeover is under way); try again in a few seconds"
                : "the leader is " + v.leader() + " at " + v.leaderUrl() + "; send writes there";
        return new NotLeaderException("this tend is a standby (" + v.instance() + "), which takes no commands or transitions: "
                + where, v.leaderUrl());
    }

    /**
     * Follows the journal into the warm engine and watches the lease until this instance
     * took it (returns the new epoch) or {@code stopping} holds (returns -1). A failure to
     * reach the database is written to the log and tried again.
     */
    long follow(LeaderLease lease, Duration ttl, BooleanSupplier stopping, java.io.PrintWriter log) throws InterruptedException {
        String lastProblem = null;
        while (!stopping.getAsBoolean()) {
            try {
                if (tail.catchUp() > 0) {
                    health.publish(tail.engine());
                    metrics.observe(tail.engine());
                }
                LeaseRow row = lease.read().orElse(null);
                long lag = Math.max(0, store.read(StoreReader::lastInputSeq) - tail.seq());
                leadership.standby(row, lag);
                metrics.leadership(leadership.view());
                if (row == null || row.lapsed()) {
                    OptionalLong epoch = lease.acquire(leadership.instance(), leadership.address(), ttl);
                    if (epoch.isPresent()) return epoch.getAsLong();
                }
                lastProblem = null;
            } catch (StoreException e) {
                if (!e.getMessage().equals(lastProblem)) {
                    synchronized (log) {
                        log.println("tend: standby cannot read the store, trying again: " + e.getMessage());
                        log.flush();
                    }
                }
                lastProblem = e.getMessage();
            }
            Thread.sleep(POLL.toMillis());
        }
        return -1;
    }

    /** The warm engine, for the leader this instance becomes. */
    JournalTail tail() {
        return tail;
    }

    @Override
    public void close() {
        api.close();
        if (tls != null) tls.close();
    }
}
