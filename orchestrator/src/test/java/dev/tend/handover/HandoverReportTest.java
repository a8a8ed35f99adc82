package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;

import static dev.tend.handover.NightShift.EVENING;
import static dev.tend.handover.NightShift.SINCE;
import static dev.tend.handover.NightShift.UNTIL;
import static dev.tend.handover.NightShift.VENDOR_NOTE;
import static dev.tend.handover.NightShift.at;
import static org.assertj.core.api.Assertions.assertThat;

/** The handover report of one scripted night ({@link NightShift#overnight}), produced by the real engine. */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class HandoverReportTest {
    private NightShift night;

    @BeforeAll
    void playTheNight(@TempDir Path dir) throws Exception {
        night = NightShift.overnight(dir.resolve("tend.db"));
    }

    @AfterAll
    void closeTheStore() {
        night.close();
    }

    @Test
    void countsMatchTheRunsOfTheNight() {
        HandoverReport r = night.report(SINCE, UNTIL);

        assertThat(r.totals()).isEqualTo(new RunCounts(4, 2, 1, 1, 0, 1, 1, 0));
        assertThat(r.byPlaybook()).containsOnlyKeys("replace-silent-node", "restart-stopped-process");
        assertThat(r.byPlaybook().get("replace-silent-node")).isEqualTo(new RunCounts(3, 2, 0, 1, 0, 1, 1, 0));
        assertThat(r.byPlaybook().get("restart-stopped-process")).isEqualTo(new RunCounts(1, 0, 1, 0, 0, 0, 0, 0));
        assertThat(r.byReason()).containsExactly(new ReasonCount("excluded", 0, 1), new ReasonCount("fleet-brake", 1, 0));
    }

    @Test
    void listsEveryRunOfThePeriodWithItsStateAtTheEnd() {
        HandoverReport r = night.report(SINCE, UNTIL);

        assertThat(r.runs()).extracting(RunLine::target, RunLine::state).containsExactly(
                org.assertj.core.groups.Tuple.tuple("fares-2/n1", "succeeded"),
                org.assertj.core.groups.Tuple.tuple("fares-10/n1", "cancelled"),
                org.assertj.core.groups.Tuple.tuple("fares-3/n2", "succeeded"),
                org.assertj.core.groups.Tuple.tuple("fares-4/n1", "failed"),
                org.assertj.core.groups.Tuple.tuple("fares-6/n1", "needs-human"),
                org.assertj.core.groups.Tuple.tuple("fares-9/n1", "awaiting-approval"));
        RunLine failed = r.runs().get(3);
        assertThat(failed.startedAt()).isEqualTo(at("00:15"));
        assertThat(failed.endedAt()).isEqualTo(at("00:15:30"));
        assertThat(failed.note()).isEqualTo("failed at restart");
    }

    @Test
    void nodesRemediatedAreTheSucceededRunsWithTheActionsThatSucceeded() {
        Map<String, List<RunLine>> nodes = night.report(SINCE, UNTIL).nodesRemediated();

        assertThat(nodes).containsOnlyKeys("replace-silent-node");
        assertThat(nodes.get("replace-silent-node")).extracting(RunLine::target).containsExactly("fares-2/n1", "fares-3/n2");
        assertThat(nodes.get("replace-silent-node")).allSatisfy(x -> assertThat(x.actions()).containsExactly("drain-node", "replace-node"));
    }

    @Test
    void approvalsPendingAtTheEndAndLapsedInThePeriod() {
        HandoverReport r = night.report(SINCE, UNTIL);

        assertThat(r.approvalsRequested()).isEqualTo(2);
        assertThat(r.pendingApprovals()).singleElement().satisfies(a -> {
            assertThat(a.target()).isEqualTo("fares-9/n1");
            assertThat(a.requestedAt()).isEqualTo(at("04:30"));
            assertThat(a.expiresAt()).isEqualTo(at("06:30"));
            assertThat(a.isOverdueAt(UNTIL)).isFalse();
        });
        assertThat(r.lapsedApprovals()).singleElement().satisfies(a -> {
            assertThat(a.target()).isEqualTo("fares-10/n1");
            assertThat(a.decidedAt()).isEqualTo(at("00:50"));
        });
    }

    @Test
    void theRunWhoseCallWasLostWaitsForAPerson() {
        HandoverReport r = night.report(SINCE, UNTIL);

        assertThat(r.runsNeedingPerson()).singleElement().satisfies(x -> {
            assertThat(x.target()).isEqualTo("fares-6/n1");
            assertThat(x.run()).isEqualTo(night.runOn("fares-6"));
            assertThat(x.note()).startsWith("step drain: ");
        });
        assertThat(r.needsAttention()).isTrue();
    }

    @Test
    void brakePeriodsShowWhenByWhomAndWhyAndTheOneStillEngaged() {
        HandoverReport r = night.report(SINCE, UNTIL);

        assertThat(r.brakePeriods()).containsExactly(
                new BrakePeriod(at("02:00"), "ana", "drill", at("02:30"), "ben", "drill over"),
                new BrakePeriod(at("05:00"), "ana", VENDOR_NOTE, null, null, null));
        assertThat(r.brakeStillEngaged()).map(BrakePeriod::engagedAt).contains(at("05:00"));
    }

    @Test
    void aBrakePeriodThatBeganBeforeThePeriodIsShownFromItsBeginning() {
        HandoverReport r = night.report(at("02:15"), at("02:45"));

        assertThat(r.brakePeriods()).containsExactly(new BrakePeriod(at("02:00"), "ana", "drill", at("02:30"), "ben", "drill over"));
        assertThat(r.brakeStillEngaged()).isEmpty();
        assertThat(night.report(at("03:00"), at("04:00")).brakePeriods()).isEmpty();
    }

    @Test
    void periodFilterCountsOnlyEntriesInTheHalfOpenPeriod() {
        HandoverReport evening = night.report(at("21:00"), SINCE);
        assertThat(evening.totals()).isEqualTo(new RunCounts(1, 1, 0, 0, 0, 0, 0, 0));
        assertThat(evening.runs()).extracting(RunLine::target).containsExactly("fares-1/n1");

        // fares-1/n1 ended at 21:05:00 exactly: an entry at until is not in the period
        HandoverReport early = night.report(at("21:00"), at("21:05"));
        assertThat(early.totals()).isEqualTo(new RunCounts(1, 0, 0, 0, 0, 0, 0, 0));
        assertThat(early.runs()).singleElement().satisfies(x -> assertThat(x.state()).isEqualTo("running"));

        HandoverReport middle = night.report(at("23:00"), at("00:30"));
        assertThat(middle.totals()).isEqualTo(new RunCounts(2, 1, 1, 0, 0, 0, 1, 0));
        assertThat(middle.runs()).extracting(RunLine::target).containsExactly("fares-10/n1", "fares-3/n2", "fares-4/n1");
        assertThat(middle.pendingApprovals()).extracting(ApprovalLine::target).containsExactly("fares-10/n1");
        assertThat(middle.approvalsRequested()).isZero();
        assertThat(middle.brakePeriods()).isEmpty();
        assertThat(middle.ledger().entriesInPeriod()).isLessThan(night.report(SINCE, UNTIL).ledger().entriesInPeriod());
    }

    @Test
    void aRunStartedBeforeThePeriodCountsAsEndedButNotAsStarted() {
        HandoverReport r = night.report(at("21:03"), at("21:30"));

        assertThat(r.totals()).isEqualTo(new RunCounts(0, 1, 0, 0, 0, 0, 0, 0));
        assertThat(r.runs()).singleElement().satisfies(x -> assertThat(x.startedAt()).isEqualTo(at("21:00")));
    }

    /**
     * The report reads only the period and what carries state into it; for every period of the
     * night (starting every 10 minutes, 30 minutes to 9 hours long) it must say exactly what a
     * tally of the whole ledger before the period's end says.
     */
    @Test
    void everyPeriodReadsToTheReportTheWholeLedgerGives() {
        int compared = 0;
        for (java.time.Instant since = EVENING.minusSeconds(3600); since.isBefore(UNTIL); since = since.plusSeconds(600)) {
            for (long minutes : new long[]{30, 120, 540}) {
                ReportPeriod p = ReportPeriod.of(since, since.plusSeconds(60 * minutes));
                HandoverReport fast = night.report(p.since(), p.until());
                LedgerTally whole = new LedgerTally(p);
                night.store.read(x -> {
                    x.forEachLedger(dev.tend.store.LedgerFilter.all().withUntil(p.until()), whole::accept);
                    return null;
                });
                HandoverReport slow = whole.toReport(night.store.read(x -> x.verifyLedger()), fast.ledger().entries(), 1);
                assertThat(fast).as(p.toString()).usingRecursiveComparison().ignoringFields("ledger").isEqualTo(slow);
                assertThat(fast.ledger().entriesInPeriod()).as(p.toString()).isEqualTo(slow.ledger().entriesInPeriod());
                compared++;
            }
        }
        assertThat(compared).isEqualTo(3 * 60);
    }

    @Test
    void ledgerStatusCountsTheWholeLedgerAndVerifiesFromThePeriodsFirstEntryToTheHead() {
        LedgerStatus l = night.report(SINCE, UNTIL).ledger();
        dev.tend.store.LedgerVerification v = night.store.read(x -> x.verifyLedger());
        long first = night.store.read(x -> x.firstLedgerSeqAt(SINCE));

        assertThat(l.verified()).isTrue();
        assertThat(l.entries()).isEqualTo(v.entries());
        assertThat(l.headHash()).isEqualTo(v.headHash()).isEqualTo(night.store.read(x -> x.ledgerHead()).orElseThrow().hash());
        assertThat(l.entriesInPeriod()).isPositive().isLessThan(l.entries());
        assertThat(first).as("the night ledger holds entries before the period").isGreaterThan(1);
        assertThat(l.verifiedFrom()).isEqualTo(first);
        assertThat(l.verifyMessage()).isEqualTo("entries " + first + " to " + l.entries() + " verify (the " + (first - 1)
                + " before them were not read); the head hash is " + l.headHash());
    }
}
