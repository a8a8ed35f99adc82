package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.Id;

import java.util.HashSet;
import java.util.Set;

/**
 * How many nodes of a cluster would be impaired if the candidate started: nodes with an
 * active problem, nodes under remediation, and the candidate's own target. A cluster-scope
 * run counts as one more node, as its steps are expected to touch one node at a time.
 */
final class Impairment {
    private Impairment() {
    }

    static int ifStarted(Candidate c, GuardContext ctx) {
        Id cluster = c.target().cluster();
        Set<Id> impaired = new HashSet<>(ctx.health().impairedNodes(cluster));
        impaired.addAll(ctx.nodesUnderRemediation(cluster));
        int extra = ctx.clusterScopeRunsOn(cluster);
        if (c.target().node() != null) impaired.add(c.target().node());
        else extra++;
        return impaired.size() + extra;
    }

    static int clusterSize(Candidate c, GuardContext ctx, int impaired) {
        int size = ctx.health().topology().cluster(c.target().cluster()).map(s -> s.size()).orElse(0);
        return Math.max(size, impaired);
    }
}
