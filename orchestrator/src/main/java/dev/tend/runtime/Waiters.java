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
 * person with its effects), and the receipts to append to the ledger with an input. Inputs
 * are told apart by identity: the same input object submitted, the same one answered.
 */
final class Waiters {
    private final Map<Input, CompletableFuture<List<Effect>>> waiting = Collections.synchronizedMap(new IdentityHashMap<>());
    /** Ledger entries to append right after an input's own, in the transaction that commits it. */
    private final Map<Input, LedgerDraft> receipts = Collections.synchronizedMap(new IdentityHashMap<>());

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

    /** Forgets {@code in} (it was never queued). */
    void forget(Input in) {
        waiting.remove(in);
        receipts.remove(in);
    }

    boolean hasReceipts() {
        return !receipts.isEmpty();
    }

    /** Adds the receipt queued with {@code in}, if any, stamped {@code at}; it stays queued until the commit holds. */
    void receiptInto(Input in, Instant at, List<LedgerDraft> ledger) {
        LedgerDraft r = receipts.get(in);
        if (r != null) ledger.add(new LedgerDraft(at, r.kind(), r.fields()));
    }

    /** {@code in} was committed with effects {@code fx}. */
    void committed(Input in, List<Effect> fx) {
        receipts.remove(in);
        CompletableFuture<List<Effect>> f = waiting.remove(in);
        if (f != null) f.complete(fx);
    }

    /** {@code in} was committed, in a batch: completes the waiting callers of all its inputs. */
    void committed(List<Input> batch, List<List<Effect>> perInput) {
        if (!receipts.isEmpty()) {
            for (Input in : batch) receipts.remove(in);
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
        CompletableFuture<List<Effect>> f = waiting.remove(in);
        if (f != null) f.completeExceptionally(cause);
    }
}
