package dev.tend.simulator.report;

import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/** Counts the renderers share: runs per playbook by outcome, and reason codes per verdict. */
final class Tallies {
    /** Runs of one playbook: started, succeeded, failed, other (unfinished, shadowed, cancelled). */
    record RunCounts(long runs, long succeeded, long failed, long other) {
    }

    private Tallies() {
    }

    static Map<String, RunCounts> runsByPlaybook(List<RunEntry> runs) {
        Map<String, long[]> counts = new TreeMap<>();
        for (RunEntry run : runs) {
            long[] c = counts.computeIfAbsent(run.playbook().value(), k -> new long[4]);
            c[0]++;
            if (run.outcome().equals("succeeded")) c[1]++;
            else if (run.outcome().equals("failed")) c[2]++;
            else c[3]++;
        }
        Map<String, RunCounts> out = new TreeMap<>();
        counts.forEach((p, c) -> out.put(p, new RunCounts(c[0], c[1], c[2], c[3])));
        return out;
    }

    /** How many decisions with {@code verdict} name each reason code, in guard order. */
    static Map<ReasonCode, Long> reasons(List<DecisionEntry> decisions, Verdict verdict) {
        Map<ReasonCode, Long> counts = new EnumMap<>(ReasonCode.class);
        for (DecisionEntry d : decisions) {
            if (d.verdict() != verdict) continue;
            for (ReasonCode c : d.reasons()) counts.merge(c, 1L, Long::sum);
        }
        return counts;
    }

    static Map<String, Integer> notificationsByChannel(List<NotificationEntry> notifications) {
        Map<String, Integer> byChannel = new TreeMap<>();
        for (NotificationEntry n : notifications) byChannel.merge(n.channel(), 1, Integer::sum);
        return byChannel;
    }
}
