package dev.tend.runtime;

import dev.tend.engine.LedgerKind;
import dev.tend.shared.json.CanonicalJson;
import dev.tend.store.LedgerDraft;
import dev.tend.store.OpenReceipt;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The receipts of one commit, folded by caller: the {@code transitions-received} receipts of
 * requests committed together that name the same caller and address become one
 * {@link OpenReceipt}, with their {@code accepted}, {@code rejected} and {@code requests}
 * summed, which the commit adds to the open receipts of that caller ({@link ReceiptCloser}
 * appends them to the ledger about once a second). Any other receipt is kept as it is, in
 * its order, for the ledger.
 *
 * <p>Why: a health pipeline that posts one transition per request put one ledger entry per
 * transition beside it, a row, its three index entries, a canonical rendering and a SHA-256
 * on the driver for each (DEVELOPERS.md, "Receipts by commit"). What the receipt says (who
 * fed the engine, from where, how much) is kept; what is lost is only where one request ended
 * and the next began within one commit, which the receipt never named.
 */
final class ReceiptTally {
    /** The folded receipts in the order their callers first appeared, and the receipts kept apart. */
    private final Map<Object, Object> byCaller = new LinkedHashMap<>();

    /** Takes {@code receipt} (null: none), stamped {@code at}. */
    void add(LedgerDraft receipt, Instant at) {
        if (receipt == null) return;
        Map<String, Object> f = receipt.fields();
        if (!LedgerKind.TRANSITIONS_RECEIVED.wire().equals(receipt.kind())
                || !(f.get("accepted") instanceof Number) || !(f.get("rejected") instanceof Number)) {
            byCaller.put(new Object(), receipt.stampedAt(at)); // a key of its own: never folded
            return;
        }
        List<Object> caller = new ArrayList<>(2 * f.size());
        f.forEach((k, v) -> {
            if (!COUNTS.contains(k)) {
                caller.add(k);
                caller.add(v);
            }
        });
        Object seen = byCaller.get(caller);
        if (seen instanceof Sum s) s.add(f, at);
        else byCaller.put(caller, new Sum(receipt, at));
    }

    /** What {@link #add} took: the folded receipts appended to {@code open}, the others to {@code ledger}. */
    void into(List<LedgerDraft> ledger, List<OpenReceipt> open) {
        for (Object o : byCaller.values()) {
            if (o instanceof Sum s) open.add(s.open());
            else ledger.add((LedgerDraft) o);
        }
    }

    private static final List<String> COUNTS = List.of("accepted", "rejected", "requests");

    /** The receipts of one caller so far. */
    private static final class Sum {
        private final LedgerDraft first;
        private Instant firstAt;
        private long accepted;
        private long rejected;
        private long requests;
        private Instant at;

        Sum(LedgerDraft first, Instant at) {
            this.first = first;
            this.firstAt = at;
            this.at = at;
            add(first.fields(), at);
        }

        void add(Map<String, Object> f, Instant at) {
            accepted += ((Number) f.get("accepted")).longValue();
            rejected += ((Number) f.get("rejected")).longValue();
            requests += f.get("requests") instanceof Number n ? n.longValue() : 1;
            // the earliest and the latest, should the clock step back within a commit
            if (at.isBefore(firstAt)) firstAt = at;
            if (at.isAfter(this.at)) this.at = at;
        }

        OpenReceipt open() {
            Map<String, Object> caller = new LinkedHashMap<>(first.fields());
            caller.keySet().removeAll(COUNTS);
            return new OpenReceipt(first.kind(), CanonicalJson.serialize(caller), accepted, rejected, requests, firstAt, at);
        }
    }
}
