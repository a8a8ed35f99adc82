package dev.tend.runtime;

import dev.tend.engine.LedgerKind;
import dev.tend.store.LedgerDraft;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The receipts of one commit, folded by caller: the {@code transitions-received} receipts of
 * requests committed together that name the same caller and address become one entry, with
 * their {@code accepted}, {@code rejected} and {@code requests} summed and stamped at the
 * last of them. Any other receipt is kept as it is, in its order.
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

    /** What {@link #add} took, folded; appended to {@code ledger}. */
    void into(List<LedgerDraft> ledger) {
        for (Object o : byCaller.values()) ledger.add(o instanceof Sum s ? s.draft() : (LedgerDraft) o);
    }

    private static final List<String> COUNTS = List.of("accepted", "rejected", "requests");

    /** The receipts of one caller so far. */
    private static final class Sum {
        private final LedgerDraft first;
        private long accepted;
        private long rejected;
        private long requests;
        private Instant at;

        Sum(LedgerDraft first, Instant at) {
            this.first = first;
            add(first.fields(), at);
        }

        void add(Map<String, Object> f, Instant at) {
            accepted += ((Number) f.get("accepted")).longValue();
            rejected += ((Number) f.get("rejected")).longValue();
            requests += f.get("requests") instanceof Number n ? n.longValue() : 1;
            this.at = at;
        }

        LedgerDraft draft() {
            if (requests == 1) return first.stampedAt(at);
            Map<String, Object> fields = new LinkedHashMap<>(first.fields());
            fields.put("accepted", accepted);
            fields.put("rejected", rejected);
            fields.put("requests", requests);
            return new LedgerDraft(at, first.kind(), LedgerKind.TRANSITIONS_RECEIVED.check(fields));
        }
    }
}
