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
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Semaphore;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.locks.ReentrantLock;

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
    /** How long an attempt waits for the sends claimed with it before the polling thread records it alone. */
    private static final Duration LEFT_BEHIND = Duration.ofMillis(250);

    private final Store store;
    private final Senders senders;
    private final Clock clock;
    private final Duration firstPause;
    private final Listener listener;
    private final Set<String> inFlight = ConcurrentHashMap.newKeySet();
    private final Semaphore wake = new Semaphore(0);
    private final AtomicInteger delivering = new AtomicInteger();
    /** Pages claimed whose attempt is not made yet: the sender that makes the last one records the round. */
    private final AtomicInteger unsent = new AtomicInteger();
    /** Attempts sent and not recorded yet (see {@link #recordAttempts}). */
    private final ConcurrentLinkedQueue<Attempt> attempts = new ConcurrentLinkedQueue<>();
    private final ReentrantLock recording = new ReentrantLock();
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
                for (PageRow row : claimDue()) {
                    try {
                        senderThreads.execute(() -> deliverReleasing(row));
                    } catch (java.util.concurrent.RejectedExecutionException closing) {
                        unsent.decrementAndGet();
                        release(row);
                    }
                }
                if (unsent.get() == 0 || leftBehind()) recordAttempts(); // what a sender left: behind a slow send, or while this thread held the lock
            } catch (InterruptedException e) {
                return;
            } catch (RuntimeException e) {
                // the store is busy or closing: the next poll tries again; nothing is lost, the outbox is durable
            }
        }
    }

    /** True if the oldest attempt waiting to be recorded was made {@link #LEFT_BEHIND} ago or more (behind a slow send). */
    private boolean leftBehind() {
        Attempt oldest = attempts.peek();
        return oldest != null && System.nanoTime() - oldest.madeNanos() >= LEFT_BEHIND.toNanos();
    }

    private List<PageRow> due() {
        return store.read(r -> r.pagesDue(clock.instant(), BATCH));
    }

    /**
     * Delivers every page due now on the calling thread, one at a time (for tend ingest and
     * tests), and records their attempts in one transaction; returns how many were tried.
     */
    public int deliverDue() {
        int n = 0;
        for (PageRow row : claimDue()) {
            deliverReleasing(row);
            n++;
        }
        return n;
    }

    /**
     * The pages due and not in flight, now in flight. Under {@link #recording}, which also
     * covers recording attempts and releasing their pages: a page read as due just before its
     * attempt was recorded would otherwise be released after the read and sent again.
     */
    private List<PageRow> claimDue() {
        recording.lock();
        try {
            List<PageRow> claimed = new ArrayList<>();
            for (PageRow row : due()) {
                if (!inFlight.add(row.id())) continue;
                delivering.incrementAndGet();
                unsent.incrementAndGet();
                claimed.add(row);
            }
            return claimed;
        } finally {
            recording.unlock();
        }
    }

    /**
     * Delivers {@code row} (in flight, counted in {@link #delivering} and {@link #unsent});
     * whoever records its attempt releases it, and so does this when it fails before that.
     * The sender of the last page in flight records the attempts waiting, so that the pages
     * claimed together are recorded together; an attempt left behind a slow send is recorded
     * by the polling thread once it has waited {@link #LEFT_BEHIND} (within two of its rounds).
     */
    private void deliverReleasing(PageRow row) {
        boolean handedOver = false;
        try {
            Page page = page(row).withLink(senders.consoleUrl());
            Answer answer = senders.sender(row.channel())
                    .map(s -> send(s, page))
                    .orElseGet(() -> Answer.refused("no channel named '" + row.channel() + "' is defined in tend.yaml"));
            attempts.add(new Attempt(row, page, answer, clock.instant(), System.nanoTime()));
            handedOver = true;
        } finally {
            boolean last = unsent.decrementAndGet() == 0;
            if (!handedOver) release(row);
            if (last) recordAttempts();
        }
    }

    private void release(PageRow row) {
        inFlight.remove(row.id());
        delivering.decrementAndGet();
    }

    /** True while a page is being sent. */
    public boolean isBusy() {
        return delivering.get() > 0;
    }

    private static Answer send(PageSender s, Page page) {
        try {
            return s.send(page);
        } catch (RuntimeException e) {
            return Answer.retry("the " + s.kind() + " sender failed: " + e.getMessage());
        }
    }

    /**
     * Writes every attempt waiting, in one transaction per round, and releases their pages:
     * a sender thread that finds another one writing leaves its attempt to it (that thread
     * looks again once it has written), so that pages sent together are recorded together
     * (on a busy store, one transaction per page took the writer from the journal's commits
     * once per page; with the sends of a claim recorded by whoever writes first, the 2,309
     * pages of a 1,000,000-line ingest took 300 to 400 transactions, DEVELOPERS.md, "Ingest").
     * Attempts a failed transaction did not record are released unrecorded: their pages are
     * due again, and go out again with the same id, as after a crash.
     */
    private void recordAttempts() {
        while (!attempts.isEmpty() && recording.tryLock()) {
            List<Attempt> round = new ArrayList<>();
            try {
                for (Attempt a; (a = attempts.poll()) != null; ) round.add(a);
                if (round.isEmpty()) continue;
                List<Outcome> outcomes = new ArrayList<>(round.size());
                for (Attempt a : round) outcomes.add(outcome(a));
                store.useTransaction(tx -> {
                    for (Outcome o : outcomes) {
                        tx.updatePage(o.next());
                        tx.appendLedger(o.at(), o.kind().wire(), o.kind().check(o.fields()));
                    }
                });
                for (Outcome o : outcomes) listener.attempted(o.next().channel(), o.said());
            } catch (RuntimeException e) {
                // the store is busy or closing: these pages stay due and are sent again; the outbox is durable
            } finally {
                for (Attempt a : round) release(a.row());
                recording.unlock();
            }
        }
    }

    /**
     * A page sent and the receiver's answer, waiting to be recorded; {@code madeNanos} is the
     * JVM's monotonic time of the answer (for {@link #leftBehind}, not a time of the record).
     */
    private record Attempt(PageRow row, Page page, Answer answer, Instant at, long madeNanos) {
    }

    /** What recording an attempt writes: the outbox row, the ledger entry, and the outcome told to the listener. */
    private record Outcome(PageRow next, LedgerKind kind, Map<String, Object> fields, Instant at, String said) {
    }

    private Outcome outcome(Attempt a) {
        PageRow row = a.row();
        Page page = a.page();
        Answer answer = a.answer();
        Instant now = a.at();
        int attempt = row.attempts() + 1;
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("id", row.id());
        f.put("channel", row.channel());
        f.put("page_kind", page.kind());
        for (String k : new String[] {"cluster", "playbook", "run"}) if (page.fields().get(k) != null) f.put(k, page.fields().get(k));
        f.put("attempt", attempt);
        f.put("answer", answer.text());
        if (!answer.tries().isEmpty()) f.put("tries", answer.tries());
        if (answer.outcome() == Answer.Outcome.ACCEPTED) {
            return new Outcome(row.ended(PageRow.DELIVERED, now, answer.text()), LedgerKind.NOTIFICATION_DELIVERED, f, now, "delivered");
        }
        Instant retryAt = now.plus(pause(attempt));
        boolean giveUp = answer.outcome() == Answer.Outcome.REFUSED
                || retryAt.isAfter(row.createdAt().plus(senders.giveUpAfter(row.channel())));
        f.put("final", giveUp);
        if (giveUp) return new Outcome(row.ended(PageRow.FAILED, now, answer.text()), LedgerKind.NOTIFICATION_FAILED, f, now, "failed");
        f.put("retry_at", retryAt.toString());
        return new Outcome(row.retryAt(retryAt, answer.text()), LedgerKind.NOTIFICATION_FAILED, f, now, "retry");
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
        recordAttempts(); // an attempt a sender left to a thread that stopped before writing it
    }
}
