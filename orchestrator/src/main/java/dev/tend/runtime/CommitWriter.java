package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.engine.LedgerKind;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerDraft;
import dev.tend.store.OpenReceipt;
import dev.tend.store.Store;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * What one commit of the driver writes, in one transaction: the journal rows of its inputs,
 * the projections and ledger entries of their effects, the receipts of inputs that carry one
 * (folded by caller, {@link ReceiptTally}, into the open receipts, which it closes when they
 * are due, {@link ReceiptCloser}) and the stream positions reached. The driver decides; this writes, so that a batch, an
 * input retried on its own and a refused input are written the same way.
 */
final class CommitWriter {
    private final Store store;
    private final Waiters waiters;
    /** When the open receipts of live requests become ledger entries. */
    private final ReceiptCloser receipts = new ReceiptCloser();

    CommitWriter(Store store, Waiters waiters) {
        this.store = store;
        this.waiters = waiters;
    }

    /** Batches of at least this many ledger entries have their chain hashed aside (a thread handover each). */
    static final int LINK_ASIDE_FROM = 256;
    /**
     * Hashes the ledger chain of big batches beside the commit's other writes: SHA-256 of each
     * entry was a tenth of the committing thread's time in a 1,000,000-line ingest (DEVELOPERS.md, "Ingest").
     */
    private final java.util.concurrent.Executor linking = new java.util.concurrent.ThreadPoolExecutor(0, 1, 5,
            java.util.concurrent.TimeUnit.SECONDS, new java.util.concurrent.LinkedBlockingQueue<>(), r -> {
                Thread t = new Thread(r, "tend-ledger-link"); // ends after 5 s without work
                t.setDaemon(true);
                return t;
            });

    /**
     * A whole batch, journaled as {@code rows}: input {@code i} was decided at {@code times[i]}
     * with {@code perInput[i]}. Returns the seq of the journal's last row after it.
     */
    long batch(DecidedBatch b, List<InputRow> rows) {
        java.util.Set<dev.tend.engine.Effect> replaced = b.replacedTimers();
        int drafts = 0;
        for (Projections.Prepared p : b.prepared()) drafts += p.ledger().size();
        boolean close = !b.times().isEmpty() && receipts.isDue(b.times().get(b.times().size() - 1));
        if (drafts >= LINK_ASIDE_FROM && !waiters.hasReceipts() && !close) return batchLinkedAside(b, rows, drafts, replaced);
        List<LedgerDraft> ledger = new ArrayList<>();
        List<OpenReceipt> open = new ArrayList<>();
        long last = store.inTransaction(tx -> {
            long l = tx.appendInputs(rows);
            ReceiptTally tally = waiters.hasReceipts() ? new ReceiptTally() : null;
            for (int i = 0; i < b.size(); i++) {
                Projections.apply(tx, b.times().get(i), b.perInput().get(i), b.prepared().get(i), ledger, replaced);
                if (tally != null) tally.add(waiters.receiptOf(b.inputs().get(i)), b.times().get(i));
            }
            // the requests of one caller in it are counted in its open receipt; due ones close after the batch's own entries
            if (tally != null) tally.into(ledger, open);
            tx.addToOpenReceipts(open);
            if (close) ReceiptCloser.takeInto(tx, ledger);
            tx.appendLedger(ledger);
            b.reached().forEach((p, next) -> tx.putStreamOffset(p.topic(), p.partition(), next));
            return l;
        });
        receipts.committed(open, close);
        return last;
    }

    /** Closes the open receipts in a commit of their own when they are due ({@code now} null: at once); see {@link ReceiptCloser}. */
    void closeReceiptsIfDue(Instant now) {
        receipts.closeIfDue(store, now);
    }

    private long batchLinkedAside(DecidedBatch b, List<InputRow> rows, int drafts, java.util.Set<dev.tend.engine.Effect> replaced) {
        // the drafts the projections add, in their order (no receipts): the chain is hashed aside while the rows are written
        List<LedgerDraft> ledger = new ArrayList<>(drafts);
        for (Projections.Prepared p : b.prepared()) ledger.addAll(p.ledger());
        return store.inTransaction(tx -> {
            long[] last = {0};
            List<LedgerDraft> added = new ArrayList<>(ledger.size());
            tx.appendLedgerLinkedAside(ledger, linking, () -> {
                last[0] = tx.appendInputs(rows);
                for (int i = 0; i < b.size(); i++) {
                    Projections.apply(tx, b.times().get(i), b.perInput().get(i), b.prepared().get(i), added, replaced);
                }
                b.reached().forEach((p, next) -> tx.putStreamOffset(p.topic(), p.partition(), next));
                if (added.size() != ledger.size()) {
                    throw new IllegalStateException("the projections added " + added.size() + " ledger drafts, not the "
                            + ledger.size() + " prepared");
                }
            });
            return last[0];
        });
    }

    /** One input decided at {@code now} with {@code fx}, on its own. */
    void one(Input in, List<InputRow> rows, Instant now, List<Effect> fx) {
        List<LedgerDraft> ledger = new ArrayList<>();
        StreamPosition at = waiters.position(in);
        store.useTransaction(tx -> {
            tx.appendInputs(rows);
            Projections.apply(tx, now, fx, ledger);
            waiters.receiptInto(in, now, ledger);
            tx.appendLedger(ledger);
            if (at != null) tx.putStreamOffset(at.topic(), at.partition(), at.offset() + 1);
        });
    }

    /**
     * An input refused for {@code reason}: its {@code input-refused} entry (naming the stream
     * position it came from, if any), its receipt, the position passed and {@code progress}
     * (the source's progress row; null when the input came from no source).
     */
    void refusal(Input in, Instant now, String reason, InputRow progress) {
        StreamPosition at = waiters.position(in);
        store.useTransaction(tx -> {
            if (progress != null) tx.appendInputs(List.of(progress));
            List<LedgerDraft> entries = new ArrayList<>(2);
            Map<String, Object> fields = InputRefusal.fields(in, reason);
            if (at != null) fields.put("from", at.describe());
            entries.add(new LedgerDraft(now, LedgerKind.INPUT_REFUSED.wire(), LedgerKind.INPUT_REFUSED.check(fields)));
            waiters.receiptInto(in, now, entries);
            tx.appendLedger(entries);
            if (at != null) tx.putStreamOffset(at.topic(), at.partition(), at.offset() + 1);
        });
    }
}
