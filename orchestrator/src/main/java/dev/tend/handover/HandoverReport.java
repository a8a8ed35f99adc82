package dev.tend.handover;

import dev.tend.shared.ApprovalState;
import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.store.LedgerVerification;
import dev.tend.store.StoreReader;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.TreeMap;

/**
 * What automation did in a period, computed from the audit ledger alone (the record of
 * truth; the projections are not consulted): runs by playbook and by end, held and denied
 * candidates by playbook and by reason code, the nodes remediated, approvals, fleet brake
 * periods, runs that wait for a person, targets stopped as loops, and whether the ledger
 * verifies.
 *
 * <p>Counting rules. {@code started} counts run-started entries in the period; the ends
 * count run-ended entries in the period by their state, so a run started before the period
 * and finished in it counts as succeeded but not as started. Held and denied count distinct
 * candidates (playbook, cluster, node) with such a verdict in the period, once each however
 * often they were looked at again. What is pending, engaged or waiting for a person is as of
 * {@code until}, whenever it began.
 *
 * <p>Nodes remediated: tend knows actions by name, not by what they do to a machine, so the
 * report does not guess which action "replaces" a node. It lists every run that ended
 * succeeded in the period on a node target, grouped by playbook, with the actions that
 * succeeded on it ({@code drain-node, replace-node}); the reader sees what was done.
 *
 * @param period       the span covered
 * @param byPlaybook   counts per playbook that did anything in the period, by playbook name
 * @param byReason     held and denied candidates per reason code, in guard order
 * @param runs         every run in the period (active at some time in it), oldest first
 * @param approvals    every approval asked or settled in the period, or pending at its end, oldest first
 * @param brakePeriods every brake period overlapping the period, oldest first
 * @param loopsStopped targets the loop guard stopped that no person cleared by {@code until}, oldest first
 * @param ledger       the ledger's size, head and verification
 * @param pages        pages delivered or given up in the period, oldest first
 */
public record HandoverReport(ReportPeriod period, Map<String, RunCounts> byPlaybook, List<ReasonCount> byReason,
                             List<RunLine> runs, List<ApprovalLine> approvals, List<BrakePeriod> brakePeriods,
                             List<LoopStop> loopsStopped, LedgerStatus ledger, List<PageLine> pages) {
    public HandoverReport {
        Objects.requireNonNull(period, "HandoverReport.period must not be null");
        byPlaybook = Collections.unmodifiableMap(new TreeMap<>(Objects.requireNonNull(byPlaybook, "HandoverReport.byPlaybook must not be null")));
        byReason = List.copyOf(Objects.requireNonNull(byReason, "HandoverReport.byReason must not be null"));
        runs = List.copyOf(Objects.requireNonNull(runs, "HandoverReport.runs must not be null"));
        approvals = List.copyOf(Objects.requireNonNull(approvals, "HandoverReport.approvals must not be null"));
        brakePeriods = List.copyOf(Objects.requireNonNull(brakePeriods, "HandoverReport.brakePeriods must not be null"));
        loopsStopped = List.copyOf(Objects.requireNonNull(loopsStopped, "HandoverReport.loopsStopped must not be null"));
        Objects.requireNonNull(ledger, "HandoverReport.ledger must not be null");
        pages = List.copyOf(Objects.requireNonNull(pages, "HandoverReport.pages must not be null"));
    }

    /** A report in which no page was delivered or given up. */
    public HandoverReport(ReportPeriod period, Map<String, RunCounts> byPlaybook, List<ReasonCount> byReason, List<RunLine> runs,
                          List<ApprovalLine> approvals, List<BrakePeriod> brakePeriods, List<LoopStop> loopsStopped,
                          LedgerStatus ledger) {
        this(period, byPlaybook, byReason, runs, approvals, brakePeriods, loopsStopped, ledger, List.of());
    }

    /** Pages given up in the period: nobody heard them. */
    public List<PageLine> failedPages() {
        return pages.stream().filter(p -> p.outcome().equals(PageLine.FAILED)).toList();
    }

    /** Pages delivered in the period. */
    public List<PageLine> deliveredPages() {
        return pages.stream().filter(p -> p.outcome().equals(PageLine.DELIVERED)).toList();
    }

    /**
     * Computes the report for {@code period} from the ledger {@code reader} sees: reads, in seq
     * order, the entries of the period and those before it that tell what was running,
     * pending, engaged or stopped when it began ({@link LedgerTally#query}), and verifies the
     * chain from the period's first entry to the newest in the same walk, each entry read and
     * parsed once (see {@link LedgerStatus}; {@code tend audit verify} checks the whole chain).
     * The work grows with the period, not with the ledger. It all sees one snapshot. Throws
     * {@link dev.tend.store.StoreException} when the store fails.
     */
    public static HandoverReport from(StoreReader reader, ReportPeriod period) {
        Objects.requireNonNull(reader, "reader");
        Objects.requireNonNull(period, "period");
        LedgerTally tally = new LedgerTally(period);
        long headSeq = reader.ledgerHead().map(dev.tend.store.LedgerEntry::seq).orElse(0L);
        long first = reader.firstLedgerSeqAt(period.since());
        long from = first == 0 ? headSeq + 1 : first;
        // one walk: the chain is verified from the period's first entry while its entries are tallied
        LedgerVerification v = reader.verifyLedgerFromReading(from, LedgerTally.query(period), tally::accept);
        return tally.toReport(v, headSeq, from);
    }

    /** The counts of every playbook added up. */
    public RunCounts totals() {
        RunCounts sum = RunCounts.ZERO;
        for (RunCounts c : byPlaybook.values()) sum = sum.plus(c);
        return sum;
    }

    /** Approvals still pending at the period's end. */
    public List<ApprovalLine> pendingApprovals() {
        return approvals.stream().filter(ApprovalLine::isPending).toList();
    }

    /** Approvals that lapsed unanswered in the period. */
    public List<ApprovalLine> lapsedApprovals() {
        return approvals.stream().filter(a -> a.state().equals(ApprovalState.LAPSED.wireName()) && period.contains(a.decidedAt())).toList();
    }

    /** How many approvals were asked for in the period. */
    public int approvalsRequested() {
        return (int) approvals.stream().filter(a -> period.contains(a.requestedAt())).count();
    }

    /** Runs that wait for a person at the period's end (an outcome that could not be learnt). */
    public List<RunLine> runsNeedingPerson() {
        return runs.stream().filter(RunLine::isNeedingPerson).toList();
    }

    /** The brake period still open at the period's end, if the brake is engaged then. */
    public Optional<BrakePeriod> brakeStillEngaged() {
        return brakePeriods.stream().filter(BrakePeriod::isStillEngaged).findFirst();
    }

    /** True when something waits for a person: an approval, a run, a loop stop, the brake, or a ledger that failed verify. */
    public boolean needsAttention() {
        return !ledger.verified() || ledger.unreadable() > 0 || !pendingApprovals().isEmpty() || !runsNeedingPerson().isEmpty()
                || !loopsStopped.isEmpty() || brakeStillEngaged().isPresent() || !failedPages().isEmpty();
    }

    /** Runs that ended succeeded in the period on a node, by playbook name (see the class comment). */
    public Map<String, List<RunLine>> nodesRemediated() {
        Map<String, List<RunLine>> out = new TreeMap<>();
        for (RunLine r : runs) {
            if (r.node() != null && RunLine.SUCCEEDED.equals(r.state()) && period.contains(r.endedAt())) {
                out.computeIfAbsent(r.playbook(), k -> new ArrayList<>()).add(r);
            }
        }
        Map<String, List<RunLine>> frozen = new LinkedHashMap<>();
        out.forEach((k, v) -> frozen.put(k, List.copyOf(v)));
        return Collections.unmodifiableMap(frozen);
    }
}
