package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.LedgerDraft;

import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executor;
import java.util.concurrent.RejectedExecutionException;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The callers of the {@link Orchestrator} that wait for an input to be committed (to answer a
 * person with its effects), the receipts to append to the ledger with an input, and where an
 * event read from a stream was read (its offset is stored with it). Inputs are told apart by
 * identity: the same input object submitted, the same one answered.
 *
 * <p>What is kept for one input is one entry of one concurrent map (an HTTP request: put once
 * by its thread, read and removed once by the driver), so the request threads and the driver
 * do not queue on one lock for every request.
 */
final class Waiters {
    private final Map<Key, Pending> pending = new ConcurrentHashMap<>();
    /**
     * Where callers are told (see {@link #answerOn}); at first the thread that commits, whose
     * completing a future wakes the caller sleeping on it.
     */
    private volatile Executor answers = Runnable::run;
    /** Entries holding a receipt, and a stream position: when none does, a batch skips the look-ups. */
    private final AtomicInteger receipts = new AtomicInteger();
    private final AtomicInteger positions = new AtomicInteger();

    /** An input, equal only to itself (inputs are records: two alike are still two inputs). */
    private static final class Key {
        private final Input in;
        private final int hash;

        Key(Input in) {
            this.in = in;
            this.hash = System.identityHashCode(in);
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Key k && k.in == in;
        }

        @Override
        public int hashCode() {
            return hash;
        }
    }

    /**
     * What waits with one input. Set by the thread that submits it, before it is queued (the
     * queue hands it to the driver with everything set); read by the driver and the commit.
     */
    private static final class Pending {
        volatile CompletableFuture<List<Effect>> future;
        volatile LedgerDraft receipt;
        volatile StreamPosition position;
    }

    private Pending of(Input in) {
        return pending.computeIfAbsent(new Key(in), k -> new Pending());
    }

    /**
     * Completes the futures of callers on {@code executor} from now on, a committed batch's in
     * one task: what a caller does on completion (an HTTP route writes its answer) then runs
     * there, never on the driver, where a client slow to read its answer would hold every
     * commit back. When {@code executor} refuses a task (it was shut down), the committing
     * thread completes them itself.
     */
    void answerOn(Executor executor) {
        this.answers = Objects.requireNonNull(executor, "executor");
    }

    /** Runs {@code tell} on the answering executor (or here, when it refuses it). */
    private void tell(Runnable tell) {
        try {
            answers.execute(tell);
        } catch (RejectedExecutionException shutDown) {
            tell.run();
        }
    }

    /** A future completed with {@code in}'s effects once committed. */
    CompletableFuture<List<Effect>> await(Input in) {
        CompletableFuture<List<Effect>> f = new CompletableFuture<>();
        of(in).future = f;
        return f;
    }

    /** Appends {@code receipt} with {@code in} when it commits. */
    void withReceipt(Input in, LedgerDraft receipt) {
        Objects.requireNonNull(receipt, "receipt");
        Pending p = of(in);
        if (p.receipt == null) receipts.incrementAndGet();
        p.receipt = receipt;
    }

    /** Stores the offset after {@code at} when {@code in} commits (or is refused). */
    void withPosition(Input in, StreamPosition at) {
        Objects.requireNonNull(at, "at");
        Pending p = of(in);
        if (p.position == null) positions.incrementAndGet();
        p.position = at;
    }

    /** Where {@code in} was read from a stream; null when it was not. */
    StreamPosition position(Input in) {
        if (positions.get() == 0) return null;
        Pending p = pending.get(new Key(in));
        return p == null ? null : p.position;
    }

    /**
     * The partitions the stream events of {@code batch} were read from (keyed by a position
     * with offset 0), each with the offset after the last of them: what the batch's commit stores.
     */
    Map<StreamPosition, Long> reached(List<Input> batch) {
        if (positions.get() == 0) return Map.of();
        Map<StreamPosition, Long> out = new HashMap<>();
        for (Input in : batch) {
            StreamPosition p = position(in);
            if (p != null) out.merge(new StreamPosition(p.topic(), p.partition(), 0), p.offset() + 1, Math::max);
        }
        return out;
    }

    /** Forgets {@code in} (it was never queued). */
    void forget(Input in) {
        remove(in);
    }

    /** Whether some input may carry a receipt (false: no input does, and {@link #receiptInto} adds nothing). */
    boolean hasReceipts() {
        return receipts.get() > 0;
    }

    /** Adds the receipt queued with {@code in}, if any, stamped {@code at}; it stays queued until the commit holds. */
    void receiptInto(Input in, Instant at, List<LedgerDraft> ledger) {
        LedgerDraft r = receiptOf(in);
        if (r != null) ledger.add(r.stampedAt(at));
    }

    /** The receipt queued with {@code in}; null when there is none. It stays queued until the commit holds. */
    LedgerDraft receiptOf(Input in) {
        if (receipts.get() == 0) return null;
        Pending p = pending.get(new Key(in));
        return p == null ? null : p.receipt;
    }

    /** {@code in} was committed with effects {@code fx}. */
    void committed(Input in, List<Effect> fx) {
        Pending p = remove(in);
        if (p != null && p.future != null) {
            CompletableFuture<List<Effect>> f = p.future;
            tell(() -> f.complete(fx));
        }
    }

    /** {@code in} was committed, in a batch: completes the waiting callers of all its inputs. */
    void committed(List<Input> batch, List<List<Effect>> perInput) {
        if (pending.isEmpty()) return;
        List<CompletableFuture<List<Effect>>> futures = null;
        List<List<Effect>> effects = null;
        for (int i = 0; i < batch.size(); i++) {
            Pending p = remove(batch.get(i));
            if (p == null || p.future == null) continue;
            if (futures == null) {
                futures = new ArrayList<>();
                effects = new ArrayList<>();
            }
            futures.add(p.future);
            effects.add(perInput.get(i));
        }
        if (futures == null) return;
        List<CompletableFuture<List<Effect>>> fs = futures;
        List<List<Effect>> fx = effects;
        tell(() -> {
            for (int i = 0; i < fs.size(); i++) fs.get(i).complete(fx.get(i));
        });
    }

    /**
     * Nothing waiting now will be committed (the driver stopped): every caller gets
     * {@code cause}. A caller may then stop waiting at once instead of finding out by polling.
     */
    void failAll(Throwable cause) {
        List<CompletableFuture<List<Effect>>> fs = new ArrayList<>();
        for (Key k : List.copyOf(pending.keySet())) {
            Pending p = remove(k.in);
            if (p != null && p.future != null) fs.add(p.future);
        }
        if (!fs.isEmpty()) tell(() -> fs.forEach(f -> f.completeExceptionally(cause)));
    }

    /** {@code in} will not be committed: its caller gets {@code cause}. */
    void failed(Input in, Throwable cause) {
        Pending p = remove(in);
        if (p != null && p.future != null) {
            CompletableFuture<List<Effect>> f = p.future;
            tell(() -> f.completeExceptionally(cause));
        }
    }

    private Pending remove(Input in) {
        Pending p = pending.remove(new Key(in));
        if (p != null) {
            if (p.receipt != null) receipts.decrementAndGet();
            if (p.position != null) positions.decrementAndGet();
        }
        return p;
    }
}
