package dev.tend.audit;

import dev.tend.engine.LedgerKind;
import dev.tend.store.LedgerEntry;
import dev.tend.store.Store;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * Writes a checkpoint entry when the ledger grew since the last one, at most every
 * {@code every} of processing time, and at every stop ({@link #write}). The head is read in
 * the same transaction that appends the checkpoint, so the checkpoint always covers the entry
 * just before it. Used on one thread (the driver's).
 */
public final class CheckpointWriter {
    /** DESIGN.md section 6: at least once a minute. */
    public static final Duration EVERY = Duration.ofMinutes(1);

    private final Store store;
    private final LedgerKey key;
    private final Duration every;
    private Instant last;

    public CheckpointWriter(Store store, LedgerKey key, Duration every) {
        this.store = Objects.requireNonNull(store, "store");
        this.key = Objects.requireNonNull(key, "key");
        if (every.isNegative() || every.isZero()) throw new IllegalArgumentException("every must be positive, got " + every);
        this.every = every;
    }

    /** Writes a checkpoint if {@code every} passed since the last look. */
    public void maybeWrite(Instant now) {
        if (last == null || !now.isBefore(last.plus(every))) write(now);
    }

    /** Writes a checkpoint now, unless the ledger is empty or already ends with one. */
    public void write(Instant now) {
        last = now;
        store.useTransaction(tx -> {
            Optional<LedgerEntry> head = tx.ledgerHead();
            if (head.isEmpty() || head.get().kind().equals(Checkpoint.KIND)) return;
            LedgerEntry h = head.get();
            tx.appendLedger(now, Checkpoint.KIND, LedgerKind.CHECKPOINT.check(Checkpoint.make(key, h.seq(), h.hash()).fields()));
        });
    }
}
