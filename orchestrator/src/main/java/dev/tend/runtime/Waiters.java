package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.LedgerDraft;

import java.time.Instant;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.CompletableFuture;

/**
 * The callers of the {@link Orchestrator} that wait for an input to be committed (to answer a
 * person with its effects), the receipts to append to the ledger with an input, and where an
 * event read from a stream was read (its offset is stored with it). Inputs are told apart by
 * identity: the same input object submitted, the same one answered.
 */
final class Waiters {
    private final Map<Input, CompletableFuture<List<Effect>>> waiting = Collections.synchronizedMap(new IdentityHashMap<>());
    /** Ledger entries to append right after an input's own, in the transaction that commits it. */
    private final Map<Input, LedgerDraft> receipts = Collections.synchronizedMap(new IdentityHashMap<>());
    /** Where events read from a stream were read, until their commit or refusal. */
    private final Map<Input, StreamPosition> positions = Collections.synchronizedMap(new IdentityHashMap<>());

    /** A future completed with {@code in}'s effects once committed. */
    CompletableFuture<List<Effect>> await(Input in) {
        CompletableFuture<List<Effect>> f = new CompletableFuture<>();
        waiting.put(in, f);
        return f;
    }

    /** Appends {@code receipt} with {@code in} when it commits. */
    void withReceipt(Input in, LedgerDraft receipt) {
        receipts.put(in, Objects.requireNonNull(receipt, "receipt"));
    }

    /** Stores the offset after {@code at} when {@code in} commits (or is refused). */
    void withPosition(Input in, StreamPosition at) {
        positions.put(in, Objects.requireNonNull(at, "at"));
    }

    /** Where {@code in} was read from a stream; null when it was not. */
    StreamPosition position(Input in) {
        return positions.isEmpty() ? null : positions.get(in);
    }

    /**
     * The partitions the stream events of {@code batch} were read from (keyed by a position
     * with offset 0), each with the offset after the last of them: what the batch's commit stores.
     */
    Map<StreamPosition, Long> reached(List<Input> batch) {
        if (positions.isEmpty()) return Map.of();
        Map<StreamPosition, Long> out = new java.util.HashMap<>();
        for (Input in : batch) {
            StreamPosition p = positions.get(in);
            if (p != null) out.merge(new StreamPosition(p.topic(), p.partition(), 0), p.offset() + 1, Math::max);
        }
        return out;
    }

    /** Forgets {@code in} (it was never queued). */
    void forget(Input in) {
        waiting.remove(in);
        receipts.remove(in);
        positions.remove(in);
    }

    boolean hasReceipts() {
        return !receipts.isEmpty();
    }

    /** Adds the receipt queued with {@code in}, if any, stamped {@code at}; it stays queued until the commit holds. */
    void receiptInto(Input in, Instant at, List<LedgerDraft> ledger) {
        LedgerDraft r = receipts.get(in);
        if (r != null) ledger.add(r.stampedAt(at));
    }

    /** {@code in} was committed with effects {@code fx}. */
    void committed(Input in, List<Effect> fx) {
        receipts.remove(in);
        positions.remove(in);
        CompletableFuture<List<Effect>> f = waiting.remove(in);
        if (f != null) f.complete(fx);
    }

    /** {@code in} was committed, in a batch: completes the waiting callers of all its inputs. */
    void committed(List<Input> batch, List<List<Effect>> perInput) {
        if (!receipts.isEmpty()) {
            for (Input in : batch) receipts.remove(in);
        }
        if (!positions.isEmpty()) {
            for (Input in : batch) positions.remove(in);
        }
        if (!waiting.isEmpty()) {
            for (int i = 0; i < batch.size(); i++) {
                CompletableFuture<List<Effect>> f = waiting.remove(batch.get(i));
                if (f != null) f.complete(perInput.get(i));
            }
        }
    }

    /** {@code in} will not be committed: its caller gets {@code cause}. */
    void failed(Input in, Throwable cause) {
        receipts.remove(in);
        positions.remove(in);
        CompletableFuture<List<Effect>> f = waiting.remove(in);
        if (f != null) f.completeExceptionally(cause);
    }
}
