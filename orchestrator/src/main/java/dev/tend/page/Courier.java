package dev.tend.page;

import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.LedgerKind;
import dev.tend.shared.TendException;
import dev.tend.store.PageRow;
import dev.tend.store.Store;

import java.io.IOException;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Delivers the page outbox at least once. Pages enter the outbox in the transaction that
 * ledgers them (so nothing decided is lost by a crash); the courier takes the due ones, hands
 * each to its channel's sender, and records the answer in one transaction: the outbox row
 * (delivered, failed, or due again after a growing pause) and a ledger entry
 * ({@code notification-delivered}, or {@code notification-failed} with {@code final} false
 * while it will try again and true when it gave up) carrying the receiver's answer. A crash
 * after a send and before its record makes the page go out again with the same id, which the
 * receiver uses to drop the repeat. Any tend started on the store delivers what is pending.
 *
 * <p>Thread-safe; {@link #start()} runs a polling thread and a few sender threads, which
 * {@link #close()} stops.
 */
public final class Courier implements AutoCloseable {
    /** Told about every attempt's outcome: delivered, failed (given up) or retry. */
    public interface Listener {
        Listener NONE = (channel, outcome) -> { };

        void attempted(String channel, String outcome);
    }

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration MAX_PAUSE = Duration.ofMinutes(5);
    private static final int BATCH = 100;

    private final Store store;
    private final Senders senders;
    private final Clock clock;
    private final Duration firstPause;
    private final Listener listener;
    private final Set<String> inFlight = ConcurrentHashMap.newKeySet();
    private final Semaphore wake = new Semaphore(0);
    private final AtomicInteger delivering = new AtomicInteger();
    private ExecutorService senderThreads;
    private Thread poller;
    private volatile boolean closed;

    /**
     * @param firstPause the pause before a page is tried again after its first failed attempt; it doubles, at most 5 minutes
     */
    public Courier(Store store, Senders senders, Clock clock, Duration firstPause, Listener listener) {
        this.store = store;
        this.senders = senders;
        this.clock = clock;
        this.firstPause = firstPause;
        this.listener = listener;
    }

    /** Starts the polling thread (every 250 ms, or at once after {@link #wake()}) and four sender threads. */
    public Courier start() {
        senderThreads = Executors.newFixedThreadPool(4, r -> {
            Thread t = new Thread(r, "tend-page-sender");
            t.setDaemon(true);
            return t;
        });
        poller = new Thread(this::poll, "tend-page-courier");
        poller.setDaemon(true);
        poller.start();
        return this;
    }

    /** New pages were committed: look at the outbox now. */
    public void wake() {
        wake.release();
    }

    private void poll() {
        while (!closed) {
            try {
                wake.tryAcquire(250, TimeUnit.MILLISECONDS);
                wake.drainPermits();
                if (closed) return;
                for (PageRow row : due()) {
                    if (!inFlight.add(row.id())) continue;
                    delivering.incrementAndGet();
                    senderThreads.execute(() -> {
                        try {
                            deliver(row);
                        } finally {
                            inFlight.remove(row.id());
                            delivering.decrementAndGet();
                        }
                    });
                }
            } catch (InterruptedException e) {
                return;
            } catch (RuntimeException e) {
                // the store is busy or closing: the next poll tries again; nothing is lost, the outbox is durable
            }
        }
    }

    private List<PageRow> due() {
        return store.read(r -> r.pagesDue(clock.instant(), BATCH));
    }

    /** Delivers every page due now on the calling thread, one at a time (for tend ingest and tests); returns how many were tried. */
    public int deliverDue() {
        int n = 0;
        for (PageRow row : due()) {
            if (!inFlight.add(row.id())) continue;
            try {
                deliver(row);
                n++;
            } finally {
                inFlight.remove(row.id());
            }
        }
        return n;
    }

    /** True while a page is being sent. */
    public boolean isBusy() {
        return delivering.get() > 0;
    }

    private void deliver(PageRow row) {
        Page page = page(row).withLink(senders.consoleUrl());
        Answer answer = senders.sender(row.channel())
                .map(s -> send(s, page))
                .orElseGet(() -> Answer.refused("no channel named '" + row.channel() + "' is defined in tend.yaml"));
        record(row, page, answer);
    }

    private static Answer send(PageSender s, Page page) {
        try {
            return s.send(page);
        } catch (RuntimeException e) {
            return Answer.retry("the " + s.kind() + " sender failed: " + e.getMessage());
        }
    }

    private void record(PageRow row, Page page, Answer answer) {
        Instant now = clock.instant();
        int attempt = row.attempts() + 1;
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("id", row.id());
        f.put("channel", row.channel());
        f.put("page_kind", page.kind());
        for (String k : new String[] {"cluster", "playbook", "run"}) if (page.fields().get(k) != null) f.put(k, page.fields().get(k));
        f.put("attempt", attempt);
        f.put("answer", answer.text());
        if (!answer.tries().isEmpty()) f.put("tries", answer.tries());
        PageRow next;
        LedgerKind kind;
        String outcome;
        if (answer.outcome() == Answer.Outcome.ACCEPTED) {
            next = row.ended(PageRow.DELIVERED, now, answer.text());
            kind = LedgerKind.NOTIFICATION_DELIVERED;
            outcome = "delivered";
        } else {
            Instant retryAt = now.plus(pause(attempt));
            boolean giveUp = answer.outcome() == Answer.Outcome.REFUSED
                    || retryAt.isAfter(row.createdAt().plus(senders.giveUpAfter(row.channel())));
            kind = LedgerKind.NOTIFICATION_FAILED;
            f.put("final", giveUp);
            if (giveUp) {
                next = row.ended(PageRow.FAILED, now, answer.text());
                outcome = "failed";
            } else {
                next = row.retryAt(retryAt, answer.text());
                f.put("retry_at", retryAt.toString());
                outcome = "retry";
            }
        }
        store.useTransaction(tx -> {
            tx.updatePage(next);
            tx.appendLedger(now, kind.wire(), kind.check(f));
        });
        listener.attempted(row.channel(), outcome);
    }

    private Duration pause(int attempt) {
        Duration d = firstPause.multipliedBy(1L << Math.min(attempt - 1, 20));
        return d.compareTo(MAX_PAUSE) > 0 ? MAX_PAUSE : d;
    }

    static Page page(PageRow row) {
        try {
            Map<String, Object> f = JSON.readValue(row.payload(), new TypeReference<LinkedHashMap<String, Object>>() { });
            return new Page(f);
        } catch (IOException e) {
            throw new TendException("page " + row.id() + " in the outbox is not valid JSON: " + e.getMessage(), e);
        }
    }

    /** Stops polling and waits up to 10 s for sends in progress to be recorded. Idempotent. */
    @Override
    public void close() {
        if (closed) return;
        closed = true;
        wake.release();
        if (poller != null) {
            try {
                poller.join(2000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
        if (senderThreads != null) {
            senderThreads.shutdown();
            try {
                if (!senderThreads.awaitTermination(10, TimeUnit.SECONDS)) senderThreads.shutdownNow();
            } catch (InterruptedException e) {
                senderThreads.shutdownNow();
                Thread.currentThread().interrupt();
            }
        }
    }
}
