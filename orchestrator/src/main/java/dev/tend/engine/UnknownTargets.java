package dev.tend.engine;

import dev.tend.shared.Id;
import dev.tend.shared.NearestName;
import dev.tend.shared.Target;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.NodeSpec;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Whether a target is in the topology (the fleet file plus {@code joined}/{@code left}
 * topology events), and if not, a sentence saying what is missing with the nearest known
 * name: "cluster fares-33 is not in the topology (did you mean 'fares-3'?)".
 */
public final class UnknownTargets {
    /** Edits within which a known name is suggested (common practice, no source). */
    private static final int SUGGEST_WITHIN = 2;

    private UnknownTargets() {
    }

    /** Empty when the cluster, and the node if the target names one, are in {@code topology}. */
    public static Optional<String> describe(Fleet topology, Target target) {
        return describe(topology, target.cluster(), target.node());
    }

    /** Empty when {@code cluster}, and {@code node} unless null, are in {@code topology}. */
    public static Optional<String> describe(Fleet topology, Id cluster, Id node) {
        Optional<ClusterSpec> spec = topology.cluster(cluster);
        if (spec.isEmpty()) {
            List<String> known = new ArrayList<>();
            for (ClusterSpec c : topology.clusters()) known.add(c.id().value());
            return Optional.of("cluster " + cluster + " is not in the topology" + suggestion(cluster, known));
        }
        if (node != null && spec.get().node(node).isEmpty()) {
            List<String> known = new ArrayList<>();
            for (NodeSpec n : spec.get().nodes()) known.add(n.id().value());
            return Optional.of("node " + node + " is not in the topology of cluster " + cluster + suggestion(node, known));
        }
        return Optional.empty();
    }

    private static String suggestion(Id name, List<String> known) {
        return NearestName.among(name.value(), known, SUGGEST_WITHIN).map(n -> " (did you mean '" + n + "'?)").orElse("");
    }
}
