package dev.tend.store;

import dev.tend.shared.StepState;
import dev.tend.shared.RunState;
import dev.tend.shared.ApprovalState;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * What every store database must do with the journal and the projections; run against
 * SQLite and PostgreSQL by the subclasses. Demo data is the invented Larkspur fleet.
 */
abstract class ProjectionContractTest extends StoreTestBase {

    static InputRow transition(Instant now, Instant at, String cluster) {
        return InputRow.of(InputRow.TRANSITION, now, at, cluster,
                "{\"at\":\"" + at + "\",\"cluster\":\"" + cluster + "\",\"node\":\"n2\",\"signal\":\"storage-full\",\"state\":\"breach\"}");
    }

    @Test
    void inputsRoundTripExactlyAndGetConsecutiveSeqs() {
        Instant precise = T0.plusNanos(123_456_789);
        InputRow command = InputRow.of("command", precise, null, null, "{\"brake\":\"engage\",\"by\":\"ops-lena\"}");
        List<Long> seqs = store.inTransaction(tx -> List.of(
                tx.appendInput(transition(T0, T0.minusSeconds(5), "fares-3")),
                tx.appendInput(command),
                tx.appendInputs(List.of(transition(T0, T0, "dispatch-1"), transition(T0, T0, "tickets-12")))));
        assertThat(seqs).containsExactly(1L, 2L, 4L);

        List<InputRow> read = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(0, read::add);
            return null;
        });
        assertThat(read).hasSize(4);
        assertThat(read.get(1)).isEqualTo(command.withSeq(2));
        assertThat(read.get(0)).isEqualTo(transition(T0, T0.minusSeconds(5), "fares-3").withSeq(1));
        assertThat(lastInputSeq()).isEqualTo(4);
        long unchanged = store.inTransaction(tx -> tx.appendInputs(List.of()));
        assertThat(unchanged).isEqualTo(4);

        List<Long> after = new ArrayList<>();
        store.read(r -> {
            r.forEachInput(2, row -> after.add(row.seq()));
            return null;
        });
        assertThat(after).containsExactly(3L, 4L);
    }

    @Test
    void appendingARowThatAlreadyHasASeqIsRejected() {
        InputRow numbered = transition(T0, T0, "fares-3").withSeq(7);
        assertThatThrownBy(() -> store.useTransaction(tx -> tx.appendInput(numbered)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("appendInput takes rows with seq 0 (the store numbers them), got seq 7");
        assertThat(lastInputSeq()).isZero();
    }

    @Test
    void runsRoundTripAndAreListedNewestFirstByFilter() {
        RunRow old = new RunRow("run-1", "replace-silent-node", 3, "fares-3", "n2", RunState.SUCCEEDED, false, T0,
                T0.plusSeconds(1), T0.plusSeconds(600), "succeeded", null, "{\"replaced\":\"n2\"}");
        RunRow active = new RunRow("run-2", "replace-silent-node", 3, "dispatch-1", null, RunState.RUNNING, true,
                T0.plusSeconds(60), T0.plusSeconds(61), null, null, "drain", null);
        RunRow other = new RunRow("run-3", "restart-broker", 1, "fares-3", "n1", RunState.RUNNING, false,
                T0.plusSeconds(120), null, null, null, null, null);
        store.useTransaction(tx -> {
            tx.upsertRun(new RunRow("run-1", "replace-silent-node", 3, "fares-3", "n2", RunState.RUNNING, false, T0,
                    T0.plusSeconds(1), null, null, "drain", null));
            tx.upsertRun(active);
            tx.upsertRun(other);
            tx.upsertRun(old);
        });
        assertThat(run("run-1")).contains(old);
        assertThat(run("run-9")).isEmpty();
        assertThat(runs(RunFilter.all())).containsExactly(other, active, old);
        assertThat(runs(RunFilter.all().withActiveOnly(true))).containsExactly(other, active);
        assertThat(runs(RunFilter.all().withCluster("fares-3"))).containsExactly(other, old);
        assertThat(runs(RunFilter.all().withPlaybook("replace-silent-node"))).containsExactly(active, old);
        assertThat(runs(RunFilter.all().withSince(T0.plusSeconds(60)))).containsExactly(other, active);
        assertThat(runs(RunFilter.all().withLimit(1))).containsExactly(other);
    }

    @Test
    void stepsRoundTripInOrdinalOrder() {
        StepRow drain = new StepRow("run-1", "drain", 0, StepState.SUCCEEDED, 1, T0, T0.plusSeconds(30), "ok", null);
        StepRow replace = new StepRow("run-1", "replace", 1, StepState.RUNNING, 2, T0.plusSeconds(31), null, null, "{\"executor\":\"cmd\"}");
        store.useTransaction(tx -> {
            tx.upsertStep(replace);
            tx.upsertStep(new StepRow("run-1", "drain", 0, StepState.RUNNING, 1, T0, null, null, null));
            tx.upsertStep(drain);
            tx.upsertStep(new StepRow("run-2", "drain", 0, StepState.RUNNING, 0, null, null, null, null));
        });
        assertThat(steps("run-1")).containsExactly(drain, replace);
        assertThat(steps("run-9")).isEmpty();
    }

    @Test
    void armingATimerAgainMovesItAndCancellingRemovesIt() {
        store.useTransaction(tx -> {
            tx.armTimer(new TimerRow("hold/fares-3/n2", T0.plusSeconds(300), "{\"look\":\"again\"}"));
            tx.armTimer(new TimerRow("step/run-1/drain", T0.plusSeconds(600), null));
            tx.armTimer(new TimerRow("hold/fares-3/n2", T0.plusSeconds(900), "{\"look\":\"later\"}"));
        });
        assertThat(timers()).containsExactly(
                new TimerRow("step/run-1/drain", T0.plusSeconds(600), null),
                new TimerRow("hold/fares-3/n2", T0.plusSeconds(900), "{\"look\":\"later\"}"));
        assertThat(cancelTimer("step/run-1/drain")).isTrue();
        assertThat(cancelTimer("step/run-1/drain")).isFalse();
        assertThat(timers()).extracting(TimerRow::key).containsExactly("hold/fares-3/n2");
    }

    @Test
    void exclusionsOfClustersAndNodesRoundTripAndAreRemovedSeparately() {
        ExclusionRow cluster = new ExclusionRow("tickets-12", null, "migration to new racks", "ops-lena", T0, null);
        ExclusionRow node = new ExclusionRow("tickets-12", "n4", "disk under vendor test", "ops-milan", T0, T0.plusSeconds(3600));
        ExclusionRow moved = new ExclusionRow("tickets-12", "n4", "still under test", "ops-milan", T0, T0.plusSeconds(7200));
        store.useTransaction(tx -> {
            tx.upsertExclusion(node);
            tx.upsertExclusion(cluster);
            tx.upsertExclusion(moved);
        });
        assertThat(exclusions()).containsExactly(cluster, moved);
        assertThat(removeExclusion("tickets-12", null)).isTrue();
        assertThat(removeExclusion("tickets-12", null)).isFalse();
        assertThat(exclusions()).containsExactly(moved);
    }

    @Test
    void approvalsRoundTripAndAreListedByState() {
        ApprovalRow pending = new ApprovalRow("run-7", "replace-silent-node", "fares-3", "n2", "engine", T0,
                T0.plusSeconds(1800), ApprovalState.PENDING, null, null, "[\"approval-required\"]");
        ApprovalRow decided = new ApprovalRow("run-5", "restart-broker", "dispatch-1", null, "engine", T0.minusSeconds(60),
                T0.plusSeconds(1740), ApprovalState.APPROVED, "ops-lena", T0.plusSeconds(10), null);
        store.useTransaction(tx -> {
            tx.upsertApproval(pending);
            tx.upsertApproval(new ApprovalRow("run-5", "restart-broker", "dispatch-1", null, "engine", T0.minusSeconds(60),
                    T0.plusSeconds(1740), ApprovalState.PENDING, null, null, null));
            tx.upsertApproval(decided);
        });
        assertThat(approvals(null)).containsExactly(decided, pending);
        assertThat(approvals(ApprovalState.PENDING)).containsExactly(pending);
        assertThat(approvals(ApprovalState.LAPSED)).isEmpty();
    }

    @Test
    void fleetStateIsPutReplacedAndDeleted() {
        store.useTransaction(tx -> {
            tx.putState("brake", "{\"engaged\":false}");
            tx.putState("brake", "{\"engaged\":true,\"by\":\"ops-lena\"}");
        });
        assertThat(state("brake")).contains("{\"engaged\":true,\"by\":\"ops-lena\"}");
        assertThat(deleteState("brake")).isTrue();
        assertThat(deleteState("brake")).isFalse();
        assertThat(state("brake")).isEmpty();
    }

    @Test
    void transitionInputsAreSelectedByEventTimeKindAndClusterInJournalOrder() {
        store.useTransaction(tx -> {
            tx.appendInput(transition(T0, T0.plusSeconds(50), "fares-3"));                       // 1 late arrival, in range
            tx.appendInput(transition(T0, T0.plusSeconds(10), "dispatch-1"));                    // 2 in range
            tx.appendInput(InputRow.of(InputRow.TOPOLOGY, T0, T0.plusSeconds(20), "fares-3", "{\"topology\":\"joined\"}")); // 3
            tx.appendInput(InputRow.of("timer", T0, T0.plusSeconds(20), "fares-3", "{}"));       // 4 wrong kind
            tx.appendInput(transition(T0, T0.plusSeconds(100), "fares-3"));                      // 5 at until: out
            tx.appendInput(transition(T0, T0.minusSeconds(1), "fares-3"));                       // 6 before from: out
            tx.appendInput(transition(T0, T0, "tickets-12"));                                     // 7 at from: in
        });
        assertThat(transitionSeqs(Set.of())).containsExactly(1L, 2L, 3L, 7L);
        assertThat(transitionSeqs(Set.of("fares-3", "tickets-12"))).containsExactly(1L, 3L, 7L);
    }

    @Test
    void transitionInputsOfAPeriodAreFoundAcrossHoursAndTransactionsWhateverTheOrderTheyArrivedIn() {
        Instant nine = Instant.parse("2027-03-14T09:00:00Z");
        store.useTransaction(tx -> {
            tx.appendInput(transition(T0, nine.plusSeconds(3599), "fares-3"));                  // 1 the last second of 09:00
            tx.appendInput(transition(T0, nine.plusSeconds(3600), "fares-3"));                  // 2 10:00 sharp
            tx.appendInput(transition(T0, nine.minusSeconds(1), "dispatch-1"));                 // 3 08:59:59, late
        });
        store.useTransaction(tx -> {
            tx.appendInput(InputRow.of("timer", T0, nine.plusSeconds(60), "fares-3", "{}"));    // 4 not read by event time
            tx.appendInput(transition(T0, nine.plusSeconds(7200), "tickets-12"));               // 5 11:00
            tx.appendInput(transition(T0, nine, "dispatch-1"));                                  // 6 09:00 sharp, later still
        });

        assertThat(transitionSeqs(nine, nine.plusSeconds(3600))).containsExactly(1L, 6L);
        assertThat(transitionSeqs(nine.minusSeconds(1), nine.plusSeconds(3601))).containsExactly(1L, 2L, 3L, 6L);
        assertThat(transitionSeqs(nine.plusSeconds(3600), nine.plusSeconds(7201))).containsExactly(2L, 5L);
        assertThat(transitionSeqs(nine.plusSeconds(7201), nine.plusSeconds(9000))).isEmpty();
        assertThat(transitionSeqs(nine.minus(java.time.Duration.ofDays(400)), nine.plus(java.time.Duration.ofDays(400))))
                .containsExactly(1L, 2L, 3L, 5L, 6L);
    }

    private List<Long> transitionSeqs(Instant from, Instant until) {
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachTransitionInput(from, until, Set.of(), row -> seqs.add(row.seq()));
            return null;
        });
        return seqs;
    }

    private List<Long> transitionSeqs(Set<String> clusters) {
        List<Long> seqs = new ArrayList<>();
        store.read(r -> {
            r.forEachTransitionInput(T0, T0.plusSeconds(100), clusters, row -> seqs.add(row.seq()));
            return null;
        });
        return seqs;
    }

    @Test
    void readsInsideATransactionSeeItsOwnWrites() {
        store.useTransaction(tx -> {
            tx.appendInput(transition(T0, T0, "fares-3"));
            tx.appendLedger(T0, "verdict", Map.of("cluster", "fares-3", "verdict", "start"));
            tx.putState("brake", "{}");
            assertThat(tx.lastInputSeq()).isEqualTo(1);
            assertThat(tx.ledgerHead()).map(LedgerEntry::seq).contains(1L);
            assertThat(tx.state("brake")).contains("{}");
            assertThat(tx.verifyLedger().ok()).isTrue();
        });
    }

    @Test
    void aPageEntersTheOutboxOnceComesDueInOrderAndKeepsItsAttempts() {
        store.useTransaction(tx -> {
            tx.enqueuePage(PageRow.pending("brake/1", "oncall", T0, "{\"id\":\"brake/1\"}"));
            tx.enqueuePage(PageRow.pending("brake/1", "platform-mail", T0.plusSeconds(5), "{}")); // the same id again: nothing changes
            tx.enqueuePage(PageRow.pending("r000001/needs-human", "oncall", T0.plusSeconds(1), "{}"));
        });
        assertThat(due(T0)).extracting(PageRow::id).containsExactly("brake/1");
        assertThat(due(T0.plusSeconds(1))).extracting(PageRow::id)
                .containsExactly("brake/1", "r000001/needs-human");
        PageRow first = store.read(r -> r.page("brake/1")).orElseThrow();
        assertThat(first.channel()).isEqualTo("oncall");
        assertThat(first.payload()).isEqualTo("{\"id\":\"brake/1\"}");
        store.useTransaction(tx -> tx.updatePage(first.retryAt(T0.plusSeconds(60), "HTTP 503: busy")));
        assertThat(due(T0.plusSeconds(30))).extracting(PageRow::id).containsExactly("r000001/needs-human");
        PageRow retried = store.read(r -> r.page("brake/1")).orElseThrow();
        assertThat(retried.attempts()).isEqualTo(1);
        assertThat(retried.lastAnswer()).isEqualTo("HTTP 503: busy");
        store.useTransaction(tx -> tx.updatePage(retried.ended(PageRow.DELIVERED, T0.plusSeconds(61), "HTTP 200")));
        assertThat(due(T0.plusSeconds(120))).extracting(PageRow::id).containsExactly("r000001/needs-human");
        List<PageRow> undelivered = store.read(r -> r.pages(Set.of(PageRow.PENDING, PageRow.FAILED), 10));
        assertThat(undelivered).extracting(PageRow::id)
                .containsExactly("r000001/needs-human");
        PageRow delivered = store.read(r -> r.page("brake/1")).orElseThrow();
        assertThat(delivered).satisfies(p -> {
            assertThat(p.state()).isEqualTo(PageRow.DELIVERED);
            assertThat(p.attempts()).isEqualTo(2);
            assertThat(p.endedAt()).isEqualTo(T0.plusSeconds(61));
        });
    }

    private List<PageRow> due(Instant now) {
        return store.read(r -> r.pagesDue(now, 10));
    }

    @Test
    void reopeningMigratesNothingAgainAndKeepsEverything() {
        store.useTransaction(tx -> {
            tx.appendInput(transition(T0, T0, "fares-3"));
            tx.appendLedger(T0, "verdict", Map.of("cluster", "fares-3"));
        });
        store.close();
        store = db.open();
        store.close();
        store = db.open();
        // version 1 (journal, projections, ledger), 2.16 (the page outbox), 2.17 (snapshots), 2.18 (the leader
        // lease), 2.19 (stream offsets), 2.20 (the ledger's query indexes), 2.21 (the ledger's kind and time
        // index), 2.22 (the ledger's cluster, run and playbook indexes without the entries naming none), 2.23
        // (the journal's hours of event time instead of its event-time index), 2.24 (the open receipts) and 2.25 (the
        // journal's compact lines), each applied once
        assertThat(db.queryText("SELECT COUNT(*) FROM flyway_schema_history WHERE success = ?", true)).isEqualTo("11");
        assertThat(db.queryText("SELECT COUNT(*) FROM flyway_schema_history WHERE version IN (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", "1",
                "2.16", "2.17", "2.18", "2.19", "2.20", "2.21", "2.22", "2.23", "2.24", "2.25")).isEqualTo("11");
        assertThat(lastInputSeq()).isEqualTo(1);
        LedgerEntry second = store.inTransaction(tx -> tx.appendLedger(T0, "verdict", Map.of()));
        assertThat(second.seq()).isEqualTo(2);
        assertThat(verify().ok()).isTrue();
    }
}
