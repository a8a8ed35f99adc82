package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.Id;

import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.FleetHealthView;

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
        // the size of (impaired nodes + nodes under remediation + the target's node), counted without building the union
        Id cluster = c.target().cluster();
        FleetHealthView health = ctx.health();
        Set<Id> remediated = ctx.nodesUnderRemediation(cluster);
        int impaired = health.impairedNodeCount(cluster);
        for (Id node : remediated) if (!health.isNodeImpaired(cluster, node)) impaired++;
        int extra = ctx.clusterScopeRunsOn(cluster);
        Id node = c.target().node();
        if (node != null) {
            if (!health.isNodeImpaired(cluster, node) && !remediated.contains(node)) impaired++;
        } else {
            extra++;
        }
        return impaired + extra;
    }

    static int clusterSize(Candidate c, GuardContext ctx, int impaired) {
        ClusterSpec spec = ctx.health().clusterSpec(c.target().cluster());
        int size = spec != null ? spec.size() : 0;
        return Math.max(size, impaired);
    }
}
