package dev.tend.store;

import dev.tend.shared.StepState;
import dev.tend.shared.RunState;
import dev.tend.shared.ApprovalState;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Transactions: all or nothing, scoped to their callback, and the cached ledger head. */
abstract class TransactionContractTest extends StoreTestBase {

    static InputRow input(int i) {
        return InputRow.of(InputRow.TRANSITION, T0.plusSeconds(i), T0.plusSeconds(i), "fares-3", "{\"i\":" + i + "}");
    }

    static void writeEverything(StoreTx tx, String suffix) {
        tx.appendInput(input(1));
        tx.appendInputs(List.of(input(2), input(3)));
        tx.appendLedger(T0, "verdict", Map.of("cluster", "fares-3", "run", "run-" + suffix, "verdict", "start"));
        tx.upsertRun(new RunRow("run-" + suffix, "replace-silent-node", 3, "fares-3", "n2", RunState.RUNNING, false, T0, null, null,
                null, null, null));
        tx.upsertStep(new StepRow("run-" + suffix, "drain", 0, StepState.RUNNING, 1, T0, null, null, null));
        tx.armTimer(new TimerRow("step/run-" + suffix + "/drain", T0.plusSeconds(600), null));
        tx.upsertExclusion(new ExclusionRow("tickets-12", "n" + suffix, "vendor test", "ops-lena", T0, null));
        tx.upsertApproval(new ApprovalRow("run-" + suffix, "replace-silent-node", "fares-3", "n2", "engine", T0,
                T0.plusSeconds(1800), ApprovalState.PENDING, null, null, null));
        tx.putState("brake-" + suffix, "{\"engaged\":true}");
    }

    @Test
    void rolledBackTransactionLeavesNothingBehindAndTheNextAppendContinuesTheChain() {
        LedgerEntry first = store.inTransaction(tx -> tx.appendLedger(T0, "playbook-loaded", Map.of("playbook", "restart-broker")));
        IllegalStateException boom = new IllegalStateException("executor answered nonsense");

        assertThatThrownBy(() -> store.useTransaction(tx -> {
            writeEverything(tx, "1");
            tx.appendLedger(T0, "run", Map.of("run", "run-1", "state", "started"));
            assertThat(tx.ledgerHead()).map(LedgerEntry::seq).contains(3L);
            throw boom;
        })).isSameAs(boom);

        store.read(r -> {
            assertThat(r.lastInputSeq()).isZero();
            assertThat(r.ledgerHead()).contains(first);
            assertThat(r.runs(RunFilter.all())).isEmpty();
            assertThat(r.steps("run-1")).isEmpty();
            assertThat(r.timers()).isEmpty();
            assertThat(r.exclusions()).isEmpty();
            assertThat(r.approvals(null)).isEmpty();
            assertThat(r.state("brake-1")).isEmpty();
            return null;
        });

        LedgerEntry next = store.inTransaction(tx -> tx.appendLedger(T0.plusSeconds(1), "verdict", Map.of("verdict", "hold")));
        long nextInput = store.inTransaction(tx -> tx.appendInput(input(9)));
        assertThat(next.seq()).isEqualTo(2);
        assertThat(next.prevHash()).isEqualTo(first.hash());
        assertThat(nextInput).isEqualTo(1);
        assertThat(verify().ok()).isTrue();
    }

    @Test
    void rolledBackFirstTransactionLeavesAnEmptyLedgerThatStartsFromGenesis() {
        assertThatThrownBy(() -> store.useTransaction(tx -> {
            writeEverything(tx, "1");
            throw new IllegalStateException("stop");
        })).hasMessage("stop");
        assertThat(ledgerHead()).isEmpty();
        LedgerEntry first = store.inTransaction(tx -> tx.appendLedger(T0, "verdict", Map.of()));
        assertThat(first.seq()).isEqualTo(1);
        assertThat(first.prevHash()).isEqualTo(LedgerEntry.GENESIS_HASH);
    }

    @Test
    void committedTransactionKeepsEverything() {
        store.useTransaction(tx -> writeEverything(tx, "1"));
        store.read(r -> {
            assertThat(r.lastInputSeq()).isEqualTo(3);
            assertThat(r.ledgerHead()).map(LedgerEntry::run).contains("run-1");
            assertThat(r.runs(RunFilter.all())).hasSize(1);
            assertThat(r.steps("run-1")).hasSize(1);
            assertThat(r.timers()).hasSize(1);
            assertThat(r.exclusions()).hasSize(1);
            assertThat(r.approvals(ApprovalState.PENDING)).hasSize(1);
            assertThat(r.state("brake-1")).isPresent();
            return null;
        });
    }

    @Test
    void aCompactWireLineIsKeptCompactAndReadBackWholeAndAnyOtherPayloadAsItWasGiven() {
        String line = "{\"at\":\"2027-03-14T02:17:00.25Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        String topology = "{\"at\":\"2027-03-14T02:18:00Z\",\"cluster\":\"dispatch-1\",\"node\":\"n4\",\"topology\":\"left\"}";
        Instant at = Instant.parse("2027-03-14T02:17:00.25Z");
        List<InputRow> rows = List.of(
                InputRow.of(InputRow.TRANSITION, T0, at, "fares-3", dev.tend.shared.wire.CompactLine.of(line)),
                InputRow.of(InputRow.TOPOLOGY, T0, Instant.parse("2027-03-14T02:18:00Z"), "dispatch-1",
                        dev.tend.shared.wire.CompactLine.of(topology)),
                InputRow.of(InputRow.TRANSITION, T0, at, "fares-3", line), // a row of a store written before compact lines
                InputRow.of("timer", T0, null, null, "{\"key\":\"recheck:p/fares-3/n2\"}"));
        assertThat(rows.get(0).payload()).startsWith(",").hasSizeLessThan(line.length() - 40);
        store.useTransaction(tx -> tx.appendInputs(rows));
        List<String> payloads = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, row -> payloads.add(row.payload()));
            return null;
        });
        assertThat(payloads).containsExactly(line, topology, line, "{\"key\":\"recheck:p/fares-3/n2\"}");
    }

    @Test
    void largeTransactionsAreSentInSeveralBatchesAndStayInOrder() {
        int n = 5_000;
        List<InputRow> rows = new ArrayList<>();
        List<LedgerDraft> drafts = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            rows.add(input(i));
            drafts.add(LedgerDraft.of(T0.plusSeconds(i), "transition", Map.of("cluster", "fares-3", "i", i)));
        }
        List<LedgerEntry> entries = store.inTransaction(tx -> {
            assertThat(tx.appendInputs(rows)).isEqualTo(n);
            return tx.appendLedger(drafts);
        });
        assertThat(entries).extracting(LedgerEntry::seq).startsWith(1L, 2L).endsWith((long) n);
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, row -> seqs.add(row.seq()));
            return null;
        });
        assertThat(seqs).hasSize(n).isSorted().startsWith(1L).endsWith((long) n);
        LedgerVerification v = verify();
        assertThat(v.ok()).as(v.reason()).isTrue();
        assertThat(v.entries()).isEqualTo(n);
        assertThat(v.headHash()).isEqualTo(entries.get(n - 1).hash());
    }

    @Test
    void aSecondStoreOnTheSameDatabaseContinuesTheChainWhereTheFirstLeftIt() {
        try (Store second = db.open()) {
            for (int i = 0; i < 5; i++) {
                Store writer = i % 2 == 0 ? store : second;
                writer.useTransaction(tx -> {
                    tx.appendInput(input(1));
                    tx.appendLedger(T0, "verdict", Map.of("verdict", "start"));
                });
            }
            assertThat(second.read(StoreReader::lastInputSeq)).isEqualTo(5);
            LedgerVerification v = verify();
            assertThat(v.ok()).as(v.reason()).isTrue();
            assertThat(v.entries()).isEqualTo(5);
        }
    }

    @Test
    void concurrentWritersThroughTwoStoresKeepOneUnbrokenChain() throws Exception {
        int threads = 4;
        int transactions = 25;
        try (Store second = db.open()) {
            ExecutorService pool = Executors.newFixedThreadPool(threads);
            List<Future<?>> done = new ArrayList<>();
            for (int t = 0; t < threads; t++) {
                Store writer = t % 2 == 0 ? store : second;
                int thread = t;
                done.add(pool.submit(() -> {
                    for (int i = 0; i < transactions; i++) {
                        writer.useTransaction(tx -> {
                            tx.appendInputs(List.of(input(1), input(2), input(3)));
                            tx.appendLedger(T0, "verdict", Map.of("cluster", "fares-3", "by", "thread-" + thread));
                            tx.appendLedger(T0, "run", Map.of("cluster", "fares-3", "by", "thread-" + thread));
                        });
                    }
                }));
            }
            pool.shutdown();
            for (Future<?> f : done) f.get(120, TimeUnit.SECONDS);
        }
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, row -> seqs.add(row.seq()));
            return null;
        });
        assertThat(seqs).hasSize(threads * transactions * 3).isSorted().doesNotHaveDuplicates().endsWith((long) seqs.size());
        LedgerVerification v = verify();
        assertThat(v.ok()).as(v.reason()).isTrue();
        assertThat(v.entries()).isEqualTo(threads * transactions * 2L);
    }

    private Map<Integer, Long> offsets(String topic) {
        return store.read(r -> r.streamOffsets(topic));
    }

    @Test
    void streamOffsetsCommitAndRollBackWithTheJournalRowsTheyCount() {
        assertThat(offsets("larkspur-health")).isEmpty();
        store.useTransaction(tx -> {
            tx.appendInputs(List.of(input(1), input(2)));
            tx.putStreamOffset("larkspur-health", 0, 2);
            tx.putStreamOffset("larkspur-health", 3, 17);
            tx.putStreamOffset("other-topic", 0, 5);
        });
        assertThatThrownBy(() -> store.useTransaction(tx -> {
            tx.appendInput(input(3));
            tx.putStreamOffset("larkspur-health", 0, 3);
            throw new IllegalStateException("the caller fails after writing");
        })).isInstanceOf(IllegalStateException.class);
        assertThat(store.read(StoreReader::lastInputSeq)).isEqualTo(2);
        assertThat(offsets("larkspur-health")).containsExactly(Map.entry(0, 2L), Map.entry(3, 17L));
        store.useTransaction(tx -> tx.putStreamOffset("larkspur-health", 0, 4));
        assertThat(offsets("larkspur-health")).containsEntry(0, 4L).hasSize(2);
        assertThat(offsets("other-topic")).containsExactly(Map.entry(0, 5L));
    }

    @Test
    void aReaderUsedAfterItsCallbackReturnedIsRejected() {
        StoreReader leaked = store.read(r -> r);
        StoreTx leakedTx = store.inTransaction(tx -> tx);
        assertThatThrownBy(leaked::lastInputSeq)
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("this store callback has returned");
        assertThatThrownBy(() -> leakedTx.putState("brake", "{}"))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("this store callback has returned");
    }

    @Test
    void aTransactionInsideATransactionIsRejected() {
        assertThatThrownBy(() -> store.useTransaction(tx -> store.useTransaction(inner -> inner.putState("a", "{}"))))
                .isInstanceOf(StoreException.class)
                .hasMessageContaining("inTransaction was called inside a transaction of the store at " + store.location());
        store.useTransaction(tx -> tx.putState("a", "{}"));
        assertThat(state("a")).contains("{}");
    }

    @Test
    void aClosedStoreSaysSo() {
        store.close();
        store.close();
        assertThatThrownBy(() -> lastInputSeq())
                .isInstanceOf(StoreException.class)
                .hasMessage("the store at " + store.location() + " is closed; open it again");
    }

    @Test
    void aDatabaseFailureRollsBackAndNamesTheStore() {
        LedgerEntry first = store.inTransaction(tx -> tx.appendLedger(T0, "verdict", Map.of()));
        // Behind the store's back, a forged entry takes the seq the next append will use.
        db.execute("INSERT INTO ledger (seq, at_ns, kind, entry, prev_hash, hash) VALUES (2, 0, 'forged', '{}', ?, ?)",
                first.hash(), first.hash());
        assertThatThrownBy(() -> store.useTransaction(tx -> {
            tx.appendInput(input(1));
            tx.appendLedger(T0, "verdict", Map.of());
        }))
                .isInstanceOf(StoreException.class)
                .hasMessageStartingWith("a transaction on the store at " + store.location()
                        + " failed and was rolled back, so nothing of it was written: ");
        assertThat(lastInputSeq()).isZero();

        db.execute("DELETE FROM ledger WHERE seq = 2");
        long seq = store.inTransaction(tx -> tx.appendInput(input(2)));
        assertThat(seq).isEqualTo(1);
        assertThat(store.inTransaction(tx -> tx.appendLedger(T0, "verdict", Map.of())).prevHash()).isEqualTo(first.hash());
        assertThat(verify().ok()).isTrue();
    }
}
