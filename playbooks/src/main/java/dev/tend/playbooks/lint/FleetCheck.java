package dev.tend.playbooks.lint;

import dev.tend.playbooks.EffectiveLimits;
import dev.tend.playbooks.ImpairedShare;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.TagSelector;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;

import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;

/** The fleet checks {@code unsafe-limits} and {@code unmatched}. */
final class FleetCheck {
    private FleetCheck() {
    }

    static void check(PlaybookSet set, Playbook p, Fleet fleet, List<Finding> out) {
        TagSelector selector = p.trigger().clusters();
        List<ClusterSpec> matched = new ArrayList<>();
        for (ClusterSpec c : fleet.clusters()) if (selector.matches(c.tags())) matched.add(c);
        if (matched.isEmpty()) {
            out.add(Lint.finding(Severity.WARNING, Lint.UNMATCHED, p, p.position("trigger.clusters"), "the cluster selector " + selector
                    + " matches none of the " + fleet.size() + " clusters of fleet " + fleet.name() + hint(selector, fleet)));
            return;
        }
        unsafe(set.effectiveLimits(p), p, matched, out);
    }

    /**
     * A majority quorum of n nodes tolerates floor((n-1)/2) impaired; data kept in RF copies of
     * which m must stay healthy tolerates RF-m (any RF nodes may hold copies of the same piece).
     */
    private static void unsafe(EffectiveLimits limits, Playbook p, List<ClusterSpec> clusters, List<Finding> out) {
        ClusterSpec worst = null;
        int worstExcess = 0;
        int affected = 0;
        for (ClusterSpec c : clusters) {
            int n = c.size();
            int tolerated = c.safeImpaired();
            if (n == 0 || tolerated == Integer.MAX_VALUE) continue;
            int allowed = limits.allowedImpaired(n);
            if (allowed <= tolerated) continue;
            affected++;
            int excess = allowed - tolerated;
            if (worst == null || excess > worstExcess
                    || excess == worstExcess && c.id().compareTo(worst.id()) < 0) {
                worst = c;
                worstExcess = excess;
            }
        }
        if (worst == null) return;
        int n = worst.size();
        int others = affected - 1;
        String message = "impaired-fraction " + ImpairedShare.format(limits.impairedFraction()) + " allows "
                + limits.allowedImpaired(n) + " of " + n + " nodes of " + worst.id() + " impaired at once"
                + (others == 0 ? "" : " (and " + others + (others == 1 ? " more cluster)" : " more clusters)"))
                + "; " + bears(worst)
                + (p.limits().impairedFraction() == null ? " (the value is the fleet-wide default; the playbook does not set it)" : "");
        out.add(Lint.finding(Severity.ERROR, Lint.UNSAFE_LIMITS, p, p.position("limits.impaired-fraction"), message));
    }

    private static String bears(ClusterSpec c) {
        int quorum = c.quorum() ? (c.size() - 1) / 2 : Integer.MAX_VALUE;
        if (c.replication() == null || quorum <= c.replication().tolerableImpaired()) {
            return "a majority quorum of " + c.size() + " tolerates " + quorum;
        }
        return "replication factor " + c.replication().factor() + " with min-healthy " + c.replication().minHealthy()
                + " tolerates " + c.replication().tolerableImpaired();
    }

    private static String hint(TagSelector selector, Fleet fleet) {
        StringBuilder sb = new StringBuilder();
        for (String tag : selector.allowed().keySet()) {
            Set<String> seen = new TreeSet<>();
            for (ClusterSpec c : fleet.clusters()) {
                String v = c.tags().get(tag);
                if (v != null) seen.add(v);
            }
            sb.append(seen.isEmpty() ? "; no cluster has the tag '" + tag + "'" : "; the fleet's values of '" + tag + "' are: " + abbreviate(seen));
        }
        return sb.toString();
    }

    private static String abbreviate(Set<String> values) {
        List<String> list = new ArrayList<>(values);
        if (list.size() <= 12) return String.join(", ", list);
        return String.join(", ", list.subList(0, 12)) + " and " + (list.size() - 12) + " more";
    }
}
