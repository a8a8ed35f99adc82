package dev.tend.runtime;

import dev.tend.store.LedgerDraft;
import dev.tend.store.OpenReceipt;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** A commit's receipts: one open receipt per caller and address, the counts summed, from the first to the last. */
class ReceiptTallyTest {
    static final Instant T = Instant.parse("2027-03-14T02:17:00Z");

    private static LedgerDraft receipt(String by, String from, int accepted, int rejected) {
        return new LedgerDraft(T, "transitions-received",
                Map.of("by", by, "from", from, "accepted", accepted, "rejected", rejected, "requests", 1));
    }

    /** The tally's entries: those kept apart, then the open receipts as the ledger entries they become when closed. */
    private static List<LedgerDraft> folded(ReceiptTally tally) {
        List<LedgerDraft> out = new ArrayList<>();
        List<OpenReceipt> open = new ArrayList<>();
        tally.into(out, open);
        open.forEach(r -> out.add(ReceiptCloser.entryOf(r)));
        return out;
    }

    @Test
    void requestsOfOneCallerFromOneAddressBecomeOneEntryWithTheirCountsSummed() {
        ReceiptTally tally = new ReceiptTally();
        tally.add(receipt("fares-feed", "10.4.0.7", 1, 0), T.plusMillis(1));
        tally.add(receipt("dispatch-feed", "10.4.0.9", 3, 1), T.plusMillis(2));
        tally.add(receipt("fares-feed", "10.4.0.7", 2, 1), T.plusMillis(3));
        tally.add(null, T.plusMillis(4)); // an input without a receipt
        tally.add(receipt("fares-feed", "10.4.0.8", 1, 0), T.plusMillis(5));
        tally.add(receipt("fares-feed", "10.4.0.7", 1, 0), T.plusMillis(6));

        List<OpenReceipt> open = new ArrayList<>();
        tally.into(new ArrayList<>(), open);
        List<LedgerDraft> out = folded(tally);

        assertThat(out).extracting(d -> d.fields().get("by") + "@" + d.fields().get("from"))
                .as("in the order each caller first appeared")
                .containsExactly("fares-feed@10.4.0.7", "dispatch-feed@10.4.0.9", "fares-feed@10.4.0.8");
        assertThat(out.get(0).fields()).containsEntry("accepted", 4L).containsEntry("rejected", 1L).containsEntry("requests", 3L);
        assertThat(out.get(0).at()).as("stamped at the last of them").isEqualTo(T.plusMillis(6));
        assertThat(open.get(0).first()).as("opened at the first of them").isEqualTo(T.plusMillis(1));
        assertThat(open.get(0).caller()).as("the caller's fields, RFC 8785 canonical").isEqualTo("{\"by\":\"fares-feed\",\"from\":\"10.4.0.7\"}");
        assertThat(out.get(1).fields()).containsEntry("accepted", 3L).containsEntry("rejected", 1L).containsEntry("requests", 1L);
        assertThat(out.get(1).at()).isEqualTo(T.plusMillis(2));
        assertThat(out.get(2).at()).isEqualTo(T.plusMillis(5));
    }

    @Test
    void aReceiptOfAnotherKindOrWithoutCountsIsKeptAsItIs() {
        ReceiptTally tally = new ReceiptTally();
        LedgerDraft other = new LedgerDraft(T, "input-refused", Map.of("reason", "bad"));
        LedgerDraft older = new LedgerDraft(T, "transitions-received", Map.of("by", "fares-feed", "from", "10.4.0.7"));
        tally.add(other, T.plusMillis(1));
        tally.add(older, T.plusMillis(2));
        tally.add(older, T.plusMillis(3));

        assertThat(folded(tally)).extracting(LedgerDraft::kind, LedgerDraft::at).containsExactly(
                org.assertj.core.groups.Tuple.tuple("input-refused", T.plusMillis(1)),
                org.assertj.core.groups.Tuple.tuple("transitions-received", T.plusMillis(2)),
                org.assertj.core.groups.Tuple.tuple("transitions-received", T.plusMillis(3)));
        assertThat(folded(new ReceiptTally())).isEmpty();
    }
}
