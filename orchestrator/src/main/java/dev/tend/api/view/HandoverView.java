package dev.tend.api.view;

import dev.tend.handover.ApprovalLine;
import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.handover.HandoverReport;
import dev.tend.handover.LedgerStatus;
import dev.tend.handover.LoopStop;
import dev.tend.handover.PageLine;
import dev.tend.handover.ReasonCount;
import dev.tend.handover.RunCounts;
import dev.tend.handover.RunLine;

import java.time.Instant;
import java.util.List;
import java.util.Map;

/**
 * The handover report of a period as JSON: the report's own fields plus what its readers ask
 * first (the totals, what is pending or lapsed, what waits for a person, whether anything needs
 * attention). See {@link HandoverReport} for the counting rules.
 */
public record HandoverView(Instant since, Instant until, boolean needsAttention, RunCounts totals,
                           Map<String, RunCounts> byPlaybook, List<ReasonCount> byReason,
                           Map<String, List<RunLine>> nodesRemediated, int approvalsRequested,
                           List<ApprovalLine> pendingApprovals, List<ApprovalLine> lapsedApprovals,
                           List<RunLine> runsNeedingPerson, List<BrakePeriod> brakePeriods, List<LoopStop> loopsStopped,
                           List<RunLine> runs, List<ApprovalLine> approvals, LedgerStatus ledger, List<PageLine> pages) {
    /** The view of {@code r}. */
    public static HandoverView of(HandoverReport r) {
        return new HandoverView(r.period().since(), r.period().until(), r.needsAttention(), r.totals(), r.byPlaybook(),
                r.byReason(), r.nodesRemediated(), r.approvalsRequested(), r.pendingApprovals(), r.lapsedApprovals(),
                r.runsNeedingPerson(), r.brakePeriods(), r.loopsStopped(), r.runs(), r.approvals(), r.ledger(), r.pages());
    }
}
