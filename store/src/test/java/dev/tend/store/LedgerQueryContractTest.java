package dev.tend.store;

import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The reads that must not grow with the ledger: a page of the newest matching entries, what a
 * report of a period needs, and verification from an entry on. Each is checked against the
 * same answer computed from the whole ledger.
 */
abstract class LedgerQueryContractTest extends StoreTestBase {
    /**
     * A small history, one entry a minute from T0: run r1 starts and ends before the period,
     * r2 starts before and ends in it, r3 starts before and is still open, a brake is engaged
     * before; verdicts everywhere.
     */
    private List<LedgerEntry> history() {
        List<LedgerDraft> d = new ArrayList<>();
        d.add(draft(1, "run-started", "r1", "fares-1"));
        d.add(draft(2, "verdict", null, "fares-1"));
        d.add(draft(3, "run-ended", "r1", "fares-1"));
        d.add(draft(4, "run-started", "r2", "fares-2"));
        d.add(draft(5, "brake-engaged", null, null));
        d.add(draft(6, "approval-requested", "r3", "fares-3"));
        d.add(draft(7, "executor-call", "r2", "fares-2"));
        d.add(draft(8, "verdict", null, "fares-4"));
        // the period begins at minute 10
        d.add(draft(10, "verdict", null, "fares-1"));
        d.add(draft(11, "run-ended", "r2", "fares-2"));
        d.add(draft(12, "run-started", "r4", "fares-4"));
        d.add(draft(13, "verdict", null, "fares-4"));
        // the period ends at minute 14
        d.add(draft(15, "run-ended", "r4", "fares-4"));
        return store.inTransaction(tx -> tx.appendLedger(d));
    }

    private static LedgerDraft draft(int minute, String kind, String run, String cluster) {
        Map<String, Object> f = new LinkedHashMap<>();
        if (run != null) f.put("run", run);
        if (cluster != null) {
            f.put("cluster", cluster);
            f.put("playbook", "replace-silent-node");
        }
        return LedgerDraft.of(T0.plusSeconds(60L * minute), kind, f);
    }

    private List<LedgerEntry> newest(LedgerFilter filter, long before, int limit) {
        return store.read(r -> r.newestLedger(filter, before, limit));
    }

    private LedgerVerification verifyFrom(long seq) {
        return store.read(r -> r.verifyLedgerFrom(seq));
    }

    private long firstAt(Instant t) {
        return store.read(r -> r.firstLedgerSeqAt(t));
    }

    private java.util.SortedSet<String> kinds() {
        return store.read(StoreReader::ledgerKinds);
    }

    private static Instant minute(int m) {
        return T0.plusSeconds(60L * m);
    }

    @Test
    void aPeriodIsReadWithTheEntriesThatCarryStateIntoItAndNothingElseBeforeIt() {
        List<LedgerEntry> all = history();
        LedgerPeriodQuery q = new LedgerPeriodQuery(minute(10), minute(14), Set.of("brake-engaged", "brake-released"),
                Set.of("run-started", "approval-requested"), Set.of("run-ended"));
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachLedgerOfPeriod(q, e -> seqs.add(e.seq()));
            return null;
        });

        // r2 (open at minute 10): 4 and 7; the brake: 5; r3 (open): 6; the period: 9 to 12.
        // Not read: r1 (ended before), the verdicts before, and the entry after the period.
        assertThat(seqs).containsExactly(4L, 5L, 6L, 7L, 9L, 10L, 11L, 12L);
        assertThat(all).hasSize(13);
    }

    @Test
    void aPeriodWithoutEntriesStillCarriesTheOpenRuns() {
        history();
        LedgerPeriodQuery q = new LedgerPeriodQuery(minute(8).plusSeconds(1), minute(9), Set.of(), Set.of("run-started"),
                Set.of("run-ended"));
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachLedgerOfPeriod(q, e -> seqs.add(e.seq()));
            return null;
        });

        assertThat(seqs).containsExactly(4L, 7L);
    }

    @Test
    void theNewestPageIsTheTailOfWhatTheWholeFilterGivesNewestFirst() {
        history();
        LedgerFilter verdicts = LedgerFilter.all().withKind("verdict");
        List<LedgerEntry> whole = new ArrayList<>();
        store.read(r -> {
            r.forEachLedger(verdicts, whole::add);
            return null;
        });

        List<LedgerEntry> page = newest(verdicts, Long.MAX_VALUE, 2);
        List<LedgerEntry> older = newest(verdicts, page.get(1).seq(), 2);

        assertThat(page).containsExactly(whole.get(3), whole.get(2));
        assertThat(older).containsExactly(whole.get(1), whole.get(0));
        assertThat(newest(verdicts, whole.get(0).seq(), 2)).isEmpty();
        assertThat(newest(LedgerFilter.all().withCluster("fares-2").withSince(minute(5)), Long.MAX_VALUE, 10))
                .extracting(LedgerEntry::seq).containsExactly(10L, 7L);
        assertThat(newest(LedgerFilter.all().withSince(minute(2)).withUntil(minute(11)), 8, 3)).extracting(LedgerEntry::seq)
                .containsExactly(7L, 6L, 5L);
        assertThat(newest(LedgerFilter.all().withUntil(minute(3)), Long.MAX_VALUE, 5)).extracting(LedgerEntry::seq)
                .containsExactly(2L, 1L);
        assertThat(newest(LedgerFilter.all().withPlaybook("replace-silent-node").withRun("r4"),
                Long.MAX_VALUE, 10)).extracting(LedgerEntry::seq).containsExactly(13L, 11L);
    }

    @Test
    void verifyingFromAnEntryChecksItAndTheRestButNotTheEntriesBeforeTheOneItHangsOn() {
        history();
        assertThat(verifyFrom(9)).extracting(LedgerVerification::ok, LedgerVerification::entries)
                .containsExactly(true, 5L);
        assertThat(verifyFrom(14).reason()).startsWith("no entry follows entry 13; the head hash is ");

        db.execute("UPDATE ledger SET entry = replace(entry, 'fares-1', 'fares-9') WHERE seq = 2");
        assertThat(verifyFrom(9).ok()).as("entry 2 is not read").isTrue();
        assertThat(verifyFrom(3).firstBrokenSeq()).as("entry 2 is where the chain hangs").isEqualTo(2);
        assertThat(verifyFrom(1).firstBrokenSeq()).isEqualTo(2);

        db.execute("UPDATE ledger SET entry = replace(entry, 'fares-4', 'fares-8') WHERE seq = 12");
        assertThat(verifyFrom(9).firstBrokenSeq()).isEqualTo(12);
    }

    @Test
    void verifyingWhileReadingAPeriodHandsOnWhatTheReadAloneGivesAndVerifiesAsTheVerifierAloneEvenPastAFault() {
        history();
        LedgerPeriodQuery q = new LedgerPeriodQuery(minute(10), minute(14), Set.of("brake-engaged", "brake-released"),
                Set.of("run-started", "approval-requested"), Set.of("run-ended"));
        List<Long> alone = new ArrayList<>();
        store.read(r -> {
            r.forEachLedgerOfPeriod(q, e -> alone.add(e.seq()));
            return null;
        });
        Map<Long, com.fasterxml.jackson.databind.JsonNode> handed = new LinkedHashMap<>();
        LedgerVerification v = store.read(r -> r.verifyLedgerFromReading(9, q, (seq, at, kind, f) -> handed.put(seq, f)));

        assertThat(handed.keySet()).containsExactlyElementsOf(alone);
        assertThat(handed.get(10L).path("run").asText()).isEqualTo("r2");
        assertThat(v).isEqualTo(verifyFrom(9));

        db.execute("UPDATE ledger SET entry = replace(entry, 'fares-2', 'fares-7') WHERE seq = 10");
        db.execute("UPDATE ledger SET entry = 'not json' WHERE seq = 11");
        handed.clear();
        v = store.read(r -> r.verifyLedgerFromReading(9, q, (seq, at, kind, f) -> handed.put(seq, f)));

        assertThat(v.firstBrokenSeq()).isEqualTo(10);
        assertThat(v).isEqualTo(verifyFrom(9));
        assertThat(handed.keySet()).as("every entry is handed on after the fault").containsExactlyElementsOf(alone);
        assertThat(handed.get(10L).path("cluster").asText()).isEqualTo("fares-7");
        assertThat(handed.get(11L)).as("a text that is not JSON is handed on unparsed").isNull();
    }

    @Test
    void verifyingWhileReadingWalksAChainLongerThanOneChunkAndNamesTheFirstEntryAtFault() {
        List<LedgerDraft> d = new ArrayList<>();
        for (int i = 0; i < 9_000; i++) d.add(draft(i, "verdict", null, "fares-" + (i % 7)));
        store.useTransaction(tx -> tx.appendLedger(d));
        LedgerPeriodQuery q = new LedgerPeriodQuery(minute(100), minute(8_990), Set.of(), Set.of("run-started"),
                Set.of("run-ended"));
        long[] handed = {0};
        LedgerVerification whole = store.read(r -> r.verifyLedgerFromReading(101, q, (seq, at, kind, f) -> handed[0]++));
        assertThat(whole).extracting(LedgerVerification::ok, LedgerVerification::entries).containsExactly(true, 8_900L);
        assertThat(handed[0]).isEqualTo(8_890);

        db.execute("UPDATE ledger SET entry = replace(entry, 'fares-', 'depots-') WHERE seq IN (5000, 8500)");
        handed[0] = 0;
        LedgerVerification v = store.read(r -> r.verifyLedgerFromReading(101, q, (seq, at, kind, f) -> handed[0]++));
        assertThat(v.firstBrokenSeq()).isEqualTo(5000);
        assertThat(v).isEqualTo(verifyFrom(101));
        assertThat(handed[0]).isEqualTo(8_890);
    }

    @Test
    void theFirstEntryAtATimeAndTheKindsAreFoundByIndex() {
        history();
        assertThat(firstAt(minute(10))).isEqualTo(9);
        assertThat(firstAt(minute(9))).isEqualTo(9);
        assertThat(firstAt(minute(16))).isZero();
        assertThat(kinds()).containsExactly("approval-requested", "brake-engaged",
                "executor-call", "run-ended", "run-started", "verdict");
    }
}
