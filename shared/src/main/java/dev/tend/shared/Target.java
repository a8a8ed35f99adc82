package dev.tend.shared;

import java.util.Objects;

/** What a run acts on: a node of a cluster, or the whole cluster (node null). */
public record Target(Id cluster, Id node) implements Comparable<Target> {
    public Target {
        Objects.requireNonNull(cluster, "cluster");
    }

    public static Target node(Id cluster, Id node) {
        return new Target(cluster, Objects.requireNonNull(node, "node"));
    }

    public static Target cluster(Id cluster) {
        return new Target(cluster, null);
    }

    public boolean isCluster() {
        return node == null;
    }

    // written out rather than generated: targets are map keys on every evaluation
    @Override
    public boolean equals(Object o) {
        if (this == o) return true;
        return o instanceof Target t && cluster.equals(t.cluster) && java.util.Objects.equals(node, t.node);
    }

    @Override
    public int hashCode() {
        return 31 * cluster.hashCode() + (node == null ? 0 : node.hashCode());
    }

    @Override
    public int compareTo(Target o) {
        int c = cluster.compareTo(o.cluster);
        if (c != 0) return c;
        if (node == null) return o.node == null ? 0 : -1;
        return o.node == null ? 1 : node.compareTo(o.node);
    }

    @Override
    public String toString() {
        return node == null ? cluster.value() : cluster + "/" + node;
    }
}
