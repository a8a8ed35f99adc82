package dev.tend.store;

import dev.tend.shared.Id;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** The audit ledger: canonical entries, hash chain, filters, and finding tampering. */
abstract class LedgerContractTest extends StoreTestBase {
    static final String[] KINDS = {"verdict", "run", "step"};

    static Instant atOf(long seq) {
        return T0.plusSeconds(60 * seq);
    }

    /** 100 entries; entry k is of kind KINDS[k % 3] at T0 + k minutes, on fares-3 for even k. */
    List<LedgerEntry> write100() {
        List<LedgerDraft> drafts = new ArrayList<>();
        for (int k = 1; k <= 100; k++) {
            Map<String, Object> fields = new LinkedHashMap<>();
            fields.put("cluster", k % 2 == 0 ? "fares-3" : "dispatch-1");
            fields.put("playbook", "replace-silent-node");
            fields.put("run", "run-" + (k / 10));
            fields.put("reasons", List.of("unconfirmed", "cooldown"));
            drafts.add(LedgerDraft.of(atOf(k), KINDS[k % 3], fields));
        }
        return store.inTransaction(tx -> tx.appendLedger(drafts));
    }

    @Test
    void entriesAreWrittenInRfc8785CanonicalFormAndChainedWithSha256() throws Exception {
        Map<String, Object> detail = new HashMap<>();
        detail.put("used_pct", 97.5);
        detail.put("b", true);
        detail.put("a", null);
        Map<String, Object> fields = new LinkedHashMap<>();
        fields.put("verdict", "hold");
        fields.put("reasons", List.of("unconfirmed", "cooldown"));
        fields.put("playbook", "replace-silent-node");
        fields.put("node", Id.of("n2"));
        fields.put("cluster", "fares-3");
        fields.put("detail", detail);
        fields.put("next_look", Instant.parse("2027-03-14T02:27:00.250Z"));
        LedgerEntry e = store.inTransaction(tx -> tx.appendLedger(Instant.parse("2027-03-14T02:22:00Z"), "verdict", fields));

        // RFC 8785 section 3.2: members sorted by name (section 3.2.3), no whitespace, minimal string
        // escapes; numbers in ECMAScript form (97.5). Hand-written expectation.
        assertThat(e.entry()).isEqualTo("{\"at\":\"2027-03-14T02:22:00Z\",\"cluster\":\"fares-3\","
                + "\"detail\":{\"a\":null,\"b\":true,\"used_pct\":97.5},\"kind\":\"verdict\","
                + "\"next_look\":\"2027-03-14T02:27:00.250Z\",\"node\":\"n2\",\"playbook\":\"replace-silent-node\","
                + "\"reasons\":[\"unconfirmed\",\"cooldown\"],\"seq\":1,\"verdict\":\"hold\"}");
        // DESIGN.md section 6: hash = SHA-256(prev_hash || canonical_entry), hex, genesis prev = 64 zeros.
        byte[] digest = MessageDigest.getInstance("SHA-256")
                .digest(("0".repeat(64) + e.entry()).getBytes(StandardCharsets.UTF_8));
        assertThat(e.hash()).isEqualTo(HexFormat.of().formatHex(digest));
        assertThat(e.prevHash()).isEqualTo("0".repeat(64));
        assertThat(e).extracting(LedgerEntry::seq, LedgerEntry::kind, LedgerEntry::cluster, LedgerEntry::playbook,
                LedgerEntry::run).containsExactly(1L, "verdict", "fares-3", "replace-silent-node", null);
        assertThat(ledgerHead()).contains(e);
    }

    @Test
    void hundredEntriesVerify() {
        List<LedgerEntry> written = write100();
        LedgerVerification v = verify();
        assertThat(v).isEqualTo(new LedgerVerification(true, 100, written.get(99).hash(), 0,
                "all 100 entries verify; the head hash is " + written.get(99).hash()));
        assertThat(written.get(50).prevHash()).isEqualTo(written.get(49).hash());
    }

    @Test
    void anEmptyLedgerVerifies() {
        assertThat(verify()).isEqualTo(new LedgerVerification(true, 0, LedgerEntry.GENESIS_HASH, 0, "the ledger is empty"));
        assertThat(ledgerHead()).isEmpty();
    }

    @Test
    void entriesAreReadBackInSeqOrderByFilter() {
        List<LedgerEntry> written = write100();
        assertThat(ledger(LedgerFilter.all())).isEqualTo(written);
        assertThat(ledger(LedgerFilter.all().withSince(atOf(10)).withUntil(atOf(13)))).extracting(LedgerEntry::seq)
                .containsExactly(10L, 11L, 12L);
        assertThat(ledger(LedgerFilter.all().withCluster("fares-3").withRun("run-1"))).extracting(LedgerEntry::seq)
                .containsExactly(10L, 12L, 14L, 16L, 18L);
        assertThat(ledger(LedgerFilter.all().withKind("run").withUntil(atOf(10)))).extracting(LedgerEntry::seq)
                .containsExactly(1L, 4L, 7L);
        assertThat(ledger(LedgerFilter.all().withPlaybook("restart-broker"))).isEmpty();
    }

    private List<LedgerEntry> ledger(LedgerFilter filter) {
        List<LedgerEntry> out = new ArrayList<>();
        store.read(r -> {
            r.forEachLedger(filter, out::add);
            return null;
        });
        return out;
    }

    @ParameterizedTest(name = "entry {0}, character {1}")
    @CsvSource({"1, 0", "1, 40", "1, -1", "50, 0", "50, 25", "50, -1", "100, 0", "100, 60", "100, -1", "37, 8"})
    void editingOneCharacterOfAnEntryIsFoundAndNamesTheEntry(long seq, int position) {
        write100();
        String text = db.queryText("SELECT entry FROM ledger WHERE seq = ?", seq);
        int p = position < 0 ? text.length() + position : position;
        char replacement = text.charAt(p) == 'x' ? 'y' : 'x';
        db.execute("UPDATE ledger SET entry = ? WHERE seq = ?", text.substring(0, p) + replacement + text.substring(p + 1), seq);

        LedgerVerification v = verify();
        assertThat(v.ok()).isFalse();
        assertThat(v.firstBrokenSeq()).isEqualTo(seq);
        assertThat(v.entries()).isEqualTo(seq - 1);
        assertThat(v.reason()).isEqualTo("entry " + seq + " (" + KINDS[(int) (seq % 3)] + " at " + atOf(seq)
                + ") was changed after it was written: its hash does not match its content");
    }

    @ParameterizedTest(name = "column {0}")
    @CsvSource({"cluster, 'tickets-12'", "playbook, 'restart-broker'", "run, 'run-99'"})
    void editingAnIndexedTextColumnIsFound(String column, String value) {
        write100();
        db.execute("UPDATE ledger SET " + column + " = ? WHERE seq = 42", value);
        LedgerVerification v = verify();
        assertThat(v.firstBrokenSeq()).isEqualTo(42);
        assertThat(v.reason()).isEqualTo("entry 42 (" + KINDS[0] + " at " + atOf(42) + ") was changed after it was written: its "
                + column + " column disagrees with its text");
    }

    @Test
    void editingTheTimeOrKindColumnIsFound() {
        write100();
        db.execute("UPDATE ledger SET at_ns = at_ns + 1000000000 WHERE seq = 42");
        assertThat(verify().reason()).isEqualTo("entry 42 (verdict at " + atOf(42).plusSeconds(1)
                + ") was changed after it was written: its at column disagrees with its text");
        db.execute("UPDATE ledger SET at_ns = at_ns - 1000000000, kind = 'approval' WHERE seq = 42");
        assertThat(verify().reason()).isEqualTo("entry 42 (approval at " + atOf(42)
                + ") was changed after it was written: its kind column disagrees with its text");
    }

    @Test
    void editingAHashOrPrevHashColumnIsFound() {
        List<LedgerEntry> written = write100();
        db.execute("UPDATE ledger SET prev_hash = ? WHERE seq = 60", written.get(10).hash());
        assertThat(verify()).extracting(LedgerVerification::firstBrokenSeq, LedgerVerification::ok).containsExactly(60L, false);
        db.execute("UPDATE ledger SET prev_hash = ?, hash = ? WHERE seq = 60", written.get(58).hash(), written.get(0).hash());
        assertThat(verify().reason()).isEqualTo("entry 60 (verdict at " + atOf(60)
                + ") was changed after it was written: its hash does not match its content");
    }

    @ParameterizedTest(name = "entry {0}")
    @ValueSource(longs = {1, 50, 99})
    void droppingAnEntryIsFoundAndNamesTheMissingEntry(long seq) {
        write100();
        db.execute("DELETE FROM ledger WHERE seq = ?", seq);
        LedgerVerification v = verify();
        assertThat(v.ok()).isFalse();
        assertThat(v.firstBrokenSeq()).isEqualTo(seq);
        String where = seq == 1 ? "the ledger starts at entry 2" : "after entry " + (seq - 1) + " comes entry " + (seq + 1);
        assertThat(v.reason()).isEqualTo("entry " + seq + " is missing: " + where + "; it was deleted after it was written");
    }

    @Test
    void droppingTheLastEntryIsFoundThroughTheHead() {
        write100();
        db.execute("DELETE FROM ledger WHERE seq = 100");
        LedgerVerification v = verify();
        assertThat(v.ok()).isFalse();
        assertThat(v.firstBrokenSeq()).isEqualTo(100);
        assertThat(v.entries()).isEqualTo(99);
        assertThat(v.reason()).isEqualTo("entry 100 is missing: the ledger head records 100 entries but the ledger ends at "
                + "entry 99; the newest entries were deleted after they were written");
    }

    @Test
    void swappingTheSeqOfTwoEntriesIsFoundAtTheFirstOfThem() {
        write100();
        db.execute("UPDATE ledger SET seq = -1 WHERE seq = 30");
        db.execute("UPDATE ledger SET seq = 30 WHERE seq = 70");
        db.execute("UPDATE ledger SET seq = 70 WHERE seq = -1");
        LedgerVerification v = verify();
        assertThat(v.ok()).isFalse();
        assertThat(v.firstBrokenSeq()).isEqualTo(30);
        // the row now at 30 is the old entry 70 (a run entry at T0 + 70 minutes)
        assertThat(v.reason()).isEqualTo("entry 30 (run at " + atOf(70) + ") is out of place: its text says it is entry 70; "
                + "entries were reordered or renumbered after they were written");
    }

    @Test
    void aHeadRowThatDisagreesWithTheLastEntryIsFound() {
        List<LedgerEntry> written = write100();
        db.execute("UPDATE ledger_head SET hash = ? WHERE id = 1", written.get(5).hash());
        LedgerVerification v = verify();
        assertThat(v.firstBrokenSeq()).isEqualTo(100);
        assertThat(v.reason()).isEqualTo("entry 100 has hash " + written.get(99).hash() + " but the ledger head records "
                + written.get(5).hash() + "; the entry or the head row was changed after it was written");
    }

    @Test
    void aBrokenLedgerVerificationThrowsOnRequest() {
        write100();
        db.execute("DELETE FROM ledger WHERE seq = 50");
        LedgerVerification v = verify();
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> v.orThrow(store.location()))
                .isInstanceOfSatisfying(LedgerBrokenException.class, e -> {
                    assertThat(e.firstBrokenSeq()).isEqualTo(50);
                    assertThat(e.location()).isEqualTo(store.location());
                })
                .hasMessage(v.reason());
    }
}
