package dev.tend.store.internal;

import dev.tend.shared.json.Sha256;
import dev.tend.shared.time.InstantText;
import dev.tend.store.LedgerDraft;
import dev.tend.store.LedgerEntry;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * How a ledger entry is written (DESIGN.md section 6): its text is the RFC 8785 canonical
 * JSON of the draft's fields plus "seq", "at" (RFC 3339 UTC, fractional seconds only when
 * not zero) and "kind" ({@link LedgerDraft#textAt}); its hash is SHA-256 of the previous
 * hash followed by that text.
 */
public final class LedgerChain {
    private LedgerChain() {
    }

    /** The entry {@code draft} becomes at {@code seq}, after an entry whose hash is {@code prevHash}. */
    public static LedgerEntry link(long seq, String prevHash, LedgerDraft draft) {
        String text = draft.textAt(seq);
        return new LedgerEntry(seq, draft.at(), draft.kind(), draft.indexed("cluster"), draft.indexed("playbook"),
                draft.indexed("run"), text, prevHash, hash(prevHash, text));
    }

    /** The entries {@code drafts} become, in order, after the entry {@code seq} whose hash is {@code prevHash}. */
    static List<LedgerEntry> linkAll(long seq, String prevHash, List<LedgerDraft> drafts) {
        List<LedgerEntry> out = new ArrayList<>(drafts.size());
        String prev = prevHash;
        for (LedgerDraft d : drafts) {
            LedgerEntry e = link(++seq, prev, d);
            out.add(e);
            prev = e.hash();
        }
        return out;
    }

    public static String hash(String prevHash, String entryText) {
        return Sha256.hexOf(prevHash, entryText);
    }

    /** RFC 3339 in UTC, e.g. 2027-03-14T02:17:00Z, with fractional seconds only when not zero. */
    public static String formatAt(Instant at) {
        return InstantText.of(at);
    }
}
