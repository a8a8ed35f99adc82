package dev.tend.audit;

import dev.tend.store.LedgerFilter;
import dev.tend.store.LedgerVerification;
import dev.tend.shared.json.HmacSha256;
import dev.tend.store.StoreReader;

import java.util.ArrayList;
import java.util.List;

/**
 * Verifies the ledger beyond its hash chain (DESIGN.md section 6): every checkpoint against
 * the {@link LedgerKey}, and an {@link Anchor} kept elsewhere. The chain alone finds an
 * edited, dropped or reordered entry; the key finds a rewrite that recomputed every hash
 * (or checkpoints made with another key); the anchor finds that, and a tail cut off with
 * the head moved back. The first entry at fault is the first one no check vouches for.
 */
public final class AnchorVerifier {
    /**
     * What the verification found.
     *
     * @param ok           nothing is at fault
     * @param entries      entries in the ledger
     * @param headHash     the head's hash
     * @param firstAtFault the first entry no check vouches for (0 when ok)
     * @param message      a sentence: what is at fault and why, or what was proven
     * @param notes        further facts worth a person's eye (entries not yet covered by a checkpoint)
     */
    public record Result(boolean ok, long entries, String headHash, long firstAtFault, String message, List<String> notes) {
        public Result {
            notes = List.copyOf(notes);
        }
    }

    private AnchorVerifier() {
    }

    /** Verifies the chain, then the checkpoints under {@code key} (null: not checked) and {@code anchor} (null: none). */
    public static Result verify(StoreReader r, LedgerKey key, Anchor anchor) {
        LedgerVerification chain = r.verifyLedger();
        if (!chain.ok()) {
            return new Result(false, chain.entries(), chain.headHash(), chain.firstBrokenSeq(), chain.reason(), List.of());
        }
        Walk w = new Walk(key, anchor);
        r.forEachLedger(LedgerFilter.all(), e -> w.visit(e.seq(), e.kind(), e.entry(), e.prevHash(), e.hash()));
        List<String> notes = new ArrayList<>();
        if (w.fault == null && anchor != null && !w.anchorSeen) {
            w.fault(w.lastSeq + 1, "the ledger ends at entry " + w.lastSeq + ", but the anchor names entry " + anchor.seq()
                    + ": entries after " + w.lastSeq + " were cut off and the head moved back");
        }
        if (w.fault == null && key != null && w.checkpoints == 0 && w.lastSeq > 0) {
            w.fault(1, "the ledger holds no checkpoint, so nothing in it is proven by the key (id " + key.id()
                    + "); tend writes them when started with --ledger-key");
        }
        if (w.fault != null) return new Result(false, chain.entries(), chain.headHash(), w.faultSeq, w.fault, notes);
        StringBuilder proven = new StringBuilder("hash chain whole");
        if (key != null) {
            proven.append("; ").append(w.checkpoints).append(w.checkpoints == 1 ? " checkpoint" : " checkpoints")
                    .append(" hold under key ").append(key.id()).append(" (entries 1 to ").append(w.lastCovered).append(')');
            if (w.lastSeq > w.lastCheckpoint) {
                notes.add("entries " + (w.lastCheckpoint + 1) + " to " + w.lastSeq + " come after the last checkpoint: the key"
                        + " does not cover them yet (tend writes one every minute and at every stop; a crash leaves a tail)");
            }
        }
        if (anchor != null) proven.append("; anchor ").append(anchor.seq()).append(" holds");
        return new Result(true, chain.entries(), chain.headHash(), 0, proven.toString(), notes);
    }

    /** One pass over the entries in seq order. */
    private static final class Walk {
        private final LedgerKey key;
        private final Anchor anchor;
        long lastSeq;
        long lastCheckpoint;
        long lastCovered;
        int checkpoints;
        boolean anchorSeen;
        String fault;
        long faultSeq;

        Walk(LedgerKey key, Anchor anchor) {
            this.key = key;
            this.anchor = anchor;
        }

        void fault(long seq, String message) {
            if (fault != null) return;
            faultSeq = seq;
            fault = message;
        }

        void visit(long seq, String kind, String entry, String prevHash, String hash) {
            lastSeq = seq;
            if (fault != null) return;
            if (anchor != null && seq == anchor.seq()) {
                anchorSeen = true;
                if (!anchor.hash().equals(hash)) {
                    fault(lastCovered + 1, "entry " + seq + " does not have the anchored hash " + anchor.hash()
                            + ": the ledger from entry " + (lastCovered + 1) + " to " + seq + " was rewritten");
                    return;
                }
            }
            if (key == null || !kind.equals(Checkpoint.KIND)) return;
            long from = lastCovered + 1;
            Checkpoint c = Checkpoint.parse(entry);
            if (c == null) {
                fault(from, "checkpoint " + seq + " lacks its fields: the entries from " + from + " to " + seq + " are not proven");
            } else if (c.coversSeq() != seq - 1 || !c.coversHash().equals(prevHash)) {
                fault(from, "checkpoint " + seq + " vouches for entry " + c.coversSeq() + " with another hash than the ledger"
                        + " now holds: the entries from " + from + " to " + (seq - 1) + " were rewritten and their hashes recomputed");
            } else if (!c.keyId().equals(key.id())) {
                fault(from, "checkpoint " + seq + " was made with key " + c.keyId() + ", not with the key given (" + key.id()
                        + "): the key was swapped, or the entries from " + from + " to " + seq + " were re-signed by someone else");
            } else if (!HmacSha256.same(c.hmac(), key.sign(c.coversSeq(), c.coversHash()))) {
                fault(from, "checkpoint " + seq + " does not match its HMAC under key " + key.id() + ": the entries from " + from
                        + " to " + seq + " were rewritten");
            } else {
                checkpoints++;
                lastCheckpoint = seq;
                lastCovered = seq;
            }
        }
    }
}
