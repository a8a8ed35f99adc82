package dev.tend.simulator.report;

import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;

/**
 * Two replays of one recording with the same seed, one per playbook set ({@code --against}),
 * and what differs between them: run by run (started in one and not the other, or a
 * different outcome), playbook and target by target (different hold or deny reasons), and
 * every summary field with its delta (B minus A).
 *
 * @param runs    in the order the runs started (the earlier of the two), then by playbook and target
 * @param reasons by playbook, then target
 */
public record ReportComparison(String labelA, String labelB, ReplayReport a, ReplayReport b, List<SummaryDelta> summary,
                               List<RunDifference> runs, List<ReasonDifference> reasons) {
    public ReportComparison {
        Objects.requireNonNull(labelA, "labelA");
        Objects.requireNonNull(labelB, "labelB");
        Objects.requireNonNull(a, "a");
        Objects.requireNonNull(b, "b");
        summary = List.copyOf(summary);
        runs = List.copyOf(runs);
        reasons = List.copyOf(reasons);
    }

    private record Key(Id playbook, Id cluster, Id node) {
        static Key of(RunEntry r) {
            return new Key(r.playbook(), r.cluster(), r.node());
        }

        static Key of(DecisionEntry d) {
            return new Key(d.playbook(), d.cluster(), d.node());
        }

        String sortKey() {
            return playbook + " " + cluster + "/" + (node == null ? "" : node.value());
        }
    }

    public static ReportComparison of(String labelA, ReplayReport a, String labelB, ReplayReport b) {
        return new ReportComparison(labelA, labelB, a, b, deltas(a.summary(), b.summary()), runDifferences(a, b),
                reasonDifferences(a, b));
    }

    /** True when nothing differs: no run, no reason and no summary field. */
    public boolean isSame() {
        return runs.isEmpty() && reasons.isEmpty() && summary.stream().noneMatch(SummaryDelta::differs);
    }

    private static List<SummaryDelta> deltas(Summary a, Summary b) {
        return List.of(
                new SummaryDelta("runs_started", a.runsStarted(), b.runsStarted(), false),
                new SummaryDelta("runs_succeeded", a.runsSucceeded(), b.runsSucceeded(), false),
                new SummaryDelta("runs_failed", a.runsFailed(), b.runsFailed(), false),
                new SummaryDelta("held", a.held(), b.held(), false),
                new SummaryDelta("denied", a.denied(), b.denied(), false),
                new SummaryDelta("approvals_requested", a.approvalsRequested(), b.approvalsRequested(), false),
                new SummaryDelta("max_concurrent_runs", a.maxConcurrentRuns(), b.maxConcurrentRuns(), false),
                new SummaryDelta("brake_engaged", a.brakeEngaged() ? 1 : 0, b.brakeEngaged() ? 1 : 0, true),
                new SummaryDelta("runs_unfinished", a.runsUnfinished(), b.runsUnfinished(), false),
                new SummaryDelta("runs_stood_down", a.runsStoodDown(), b.runsStoodDown(), false),
                new SummaryDelta("hidden_events", a.hiddenEvents(), b.hiddenEvents(), false));
    }

    private static List<RunDifference> runDifferences(ReplayReport a, ReplayReport b) {
        Map<Key, List<RunEntry>> inA = byKey(a.runs());
        Map<Key, List<RunEntry>> inB = byKey(b.runs());
        Map<String, Key> keys = new TreeMap<>();
        inA.keySet().forEach(k -> keys.put(k.sortKey(), k));
        inB.keySet().forEach(k -> keys.put(k.sortKey(), k));
        List<RunDifference> out = new ArrayList<>();
        for (Key k : keys.values()) {
            List<RunEntry> ra = inA.getOrDefault(k, List.of());
            List<RunEntry> rb = inB.getOrDefault(k, List.of());
            for (int i = 0; i < Math.max(ra.size(), rb.size()); i++) {
                RunEntry x = i < ra.size() ? ra.get(i) : null;
                RunEntry y = i < rb.size() ? rb.get(i) : null;
                RunDifference.Kind kind = x == null ? RunDifference.Kind.ONLY_IN_B : y == null ? RunDifference.Kind.ONLY_IN_A
                        : x.outcome().equals(y.outcome()) ? null : RunDifference.Kind.OUTCOME;
                if (kind != null) out.add(new RunDifference(kind, k.playbook(), k.cluster(), k.node(), i + 1, x, y));
            }
        }
        out.sort(Comparator.comparing(ReportComparison::firstStart).thenComparing(d -> new Key(d.playbook(), d.cluster(), d.node()).sortKey())
                .thenComparingInt(RunDifference::occurrence));
        return out;
    }

    private static Instant firstStart(RunDifference d) {
        if (d.a() == null) return d.b().startedAt();
        if (d.b() == null) return d.a().startedAt();
        return d.a().startedAt().isBefore(d.b().startedAt()) ? d.a().startedAt() : d.b().startedAt();
    }

    private static Map<Key, List<RunEntry>> byKey(List<RunEntry> runs) {
        Map<Key, List<RunEntry>> out = new LinkedHashMap<>();
        for (RunEntry r : runs) out.computeIfAbsent(Key.of(r), k -> new ArrayList<>()).add(r);
        return out;
    }

    private static List<ReasonDifference> reasonDifferences(ReplayReport a, ReplayReport b) {
        Map<Key, Set<ReasonCode>> inA = reasons(a.decisions());
        Map<Key, Set<ReasonCode>> inB = reasons(b.decisions());
        Map<String, Key> keys = new TreeMap<>();
        inA.keySet().forEach(k -> keys.put(k.sortKey(), k));
        inB.keySet().forEach(k -> keys.put(k.sortKey(), k));
        List<ReasonDifference> out = new ArrayList<>();
        for (Key k : keys.values()) {
            List<ReasonCode> ra = List.copyOf(inA.getOrDefault(k, Set.of()));
            List<ReasonCode> rb = List.copyOf(inB.getOrDefault(k, Set.of()));
            if (!ra.equals(rb)) out.add(new ReasonDifference(k.playbook(), k.cluster(), k.node(), ra, rb));
        }
        return out;
    }

    /** Every reason code named by a hold or deny verdict, per playbook and target, in guard order. */
    private static Map<Key, Set<ReasonCode>> reasons(List<DecisionEntry> decisions) {
        Map<Key, Set<ReasonCode>> out = new LinkedHashMap<>();
        for (DecisionEntry d : decisions) {
            if (d.verdict() != Verdict.HOLD && d.verdict() != Verdict.DENY) continue;
            out.computeIfAbsent(Key.of(d), k -> EnumSet.noneOf(ReasonCode.class)).addAll(d.reasons());
        }
        return out;
    }
}
