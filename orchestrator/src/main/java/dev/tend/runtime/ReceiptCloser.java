package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.store.LedgerDraft;
import dev.tend.store.OpenReceipt;
import dev.tend.store.Store;
import dev.tend.store.StoreTx;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * When the open receipts become ledger entries. A live commit adds its callers' counts to the
 * store's open receipts ({@link ReceiptTally}, {@link StoreTx#addToOpenReceipts}) instead of
 * appending a ledger entry; the first commit at least {@link #OPEN_FOR} after the oldest of
 * them opened takes them all ({@link StoreTx#takeOpenReceipts}) and appends one entry per
 * caller, stamped at the caller's last request, in the same transaction. An idle driver closes
 * them in a transaction of its own ({@link #closeIfDue}), and a stopping one at once.
 *
 * <p>Why: the entry a one-request commit appended (the ledger's row, three index entries and
 * its head) was over half of the pages that commit wrote, and a canonical rendering and a
 * SHA-256 on the driver (DEVELOPERS.md, "Receipts by the second"). The open receipts are in
 * the store, so a crash loses none: a driver starts with them due and closes what it finds.
 *
 * <p>What this knows (when the oldest open receipt opened) is only a hint of when to look;
 * the store's table is the truth. Commits run on the driver thread or the commit thread, one
 * at a time, so the hint is guarded by this object's lock.
 */
final class ReceiptCloser {
    /** How long receipts stay open: a caller's requests within it share one ledger entry. */
    static final Duration OPEN_FOR = Duration.ofSeconds(1);
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final TypeReference<LinkedHashMap<String, Object>> FIELDS = new TypeReference<>() {
    };

    /** When the oldest receipt this process knows to be open opened; MIN at a start (the store may hold some); null: none. */
    private Instant oldest = Instant.MIN;

    /** Whether a commit at {@code now} should close the open receipts. */
    synchronized boolean isDue(Instant now) {
        return oldest != null && (oldest == Instant.MIN || !now.isBefore(oldest.plus(OPEN_FOR)));
    }

    private synchronized boolean anyOpen() {
        return oldest != null;
    }

    /** After a commit that added {@code added} to the open receipts and closed them ({@code closed}) or not. */
    synchronized void committed(List<OpenReceipt> added, boolean closed) {
        if (closed) {
            oldest = null; // the close took what the commit added too
            return;
        }
        for (OpenReceipt r : added) {
            if (oldest == null || r.first().isBefore(oldest)) oldest = r.first();
        }
    }

    /** Takes the open receipts into {@code ledger}, one entry each, oldest first. */
    static void takeInto(StoreTx tx, List<LedgerDraft> ledger) {
        for (OpenReceipt r : tx.takeOpenReceipts()) ledger.add(entryOf(r));
    }

    /** Closes the open receipts in a transaction of their own when they are due ({@code now} null: any open, at once). */
    void closeIfDue(Store store, Instant now) {
        if (now == null ? !anyOpen() : !isDue(now)) return;
        store.useTransaction(tx -> {
            List<LedgerDraft> ledger = new ArrayList<>();
            takeInto(tx, ledger);
            if (!ledger.isEmpty()) tx.appendLedger(ledger);
        });
        committed(List.of(), true);
    }

    /** The ledger entry of an open receipt: its caller's fields and its counts, stamped at its last request. */
    static LedgerDraft entryOf(OpenReceipt r) {
        Map<String, Object> fields;
        try {
            fields = JSON.readValue(r.caller(), FIELDS);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("the open receipt of " + r.kind() + " has a caller that is not a JSON object: "
                    + r.caller(), e);
        }
        fields.put("accepted", r.accepted());
        fields.put("rejected", r.rejected());
        fields.put("requests", r.requests());
        return new LedgerDraft(r.last(), r.kind(), fields);
    }
}
