package dev.tend.shared.fleet;

import dev.tend.shared.Id;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;

/**
 * A cluster of the topology.
 *
 * @param replication replicated-log settings, or null when the cluster has none
 * @param quorum      true when the nodes form a majority-quorum ensemble
 */
public record ClusterSpec(Id id, Map<String, String> tags, Replication replication, boolean quorum, List<NodeSpec> nodes) {
    public ClusterSpec {
        Objects.requireNonNull(id, "id");
        tags = tags == null ? Map.of() : Map.copyOf(tags);
        nodes = List.copyOf(nodes);
    }

    public Optional<NodeSpec> node(Id node) {
        int i = indexOf(node);
        return i < 0 ? Optional.empty() : Optional.of(nodes.get(i));
    }

    /** True when {@code node} is one of this cluster's nodes (asked for every transition: no Optional, no iterator). */
    public boolean hasNode(Id node) {
        return indexOf(node) >= 0;
    }

    private int indexOf(Id node) {
        List<NodeSpec> ns = nodes;
        int size = ns.size();
        // ids read from a recording are mostly the very instances of the fleet file's: identity first
        for (int i = 0; i < size; i++) if (ns.get(i).id() == node) return i;
        for (int i = 0; i < size; i++) if (ns.get(i).id().equals(node)) return i;
        return -1;
    }

    public int size() {
        return nodes.size();
    }

    /** A copy with {@code node} added or replaced. */
    public ClusterSpec withNode(NodeSpec node) {
        Map<Id, NodeSpec> byId = new LinkedHashMap<>();
        for (NodeSpec n : nodes) byId.put(n.id(), n);
        byId.put(node.id(), node);
        return new ClusterSpec(id, tags, replication, quorum, new ArrayList<>(byId.values()));
    }

    public ClusterSpec withoutNode(Id node) {
        List<NodeSpec> kept = new ArrayList<>();
        for (NodeSpec n : nodes) if (!n.id().equals(node)) kept.add(n);
        return new ClusterSpec(id, tags, replication, quorum, kept);
    }

    /**
     * How many nodes of this cluster may be impaired at once without losing quorum (a
     * majority quorum of n tolerates floor((n-1)/2)) or healthy copies of its data (worst case:
     * any {@code factor} nodes hold copies of the same piece). {@code Integer.MAX_VALUE} when neither applies.
     */
    public int safeImpaired() {
        int safe = Integer.MAX_VALUE;
        if (quorum) safe = Math.min(safe, (nodes.size() - 1) / 2);
        if (replication != null) safe = Math.min(safe, replication.tolerableImpaired());
        return safe;
    }
}
