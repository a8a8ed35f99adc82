package dev.tend.shared.fleet;

import dev.tend.shared.Id;

import java.util.Collection;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/** The fleet topology: an immutable set of clusters in file order. */
public final class Fleet {
    private final String name;
    private final Map<Id, ClusterSpec> clusters;

    private Fleet(String name, Map<Id, ClusterSpec> clusters) {
        this.name = name;
        this.clusters = Collections.unmodifiableMap(clusters);
    }

    public static Fleet of(String name, Collection<ClusterSpec> clusters) {
        Map<Id, ClusterSpec> map = new LinkedHashMap<>();
        for (ClusterSpec c : clusters) {
            if (map.put(c.id(), c) != null) throw new IllegalArgumentException("cluster " + c.id() + " is listed twice");
        }
        return new Fleet(name, map);
    }

    public static Fleet empty() {
        return new Fleet("empty", new LinkedHashMap<>());
    }

    public String name() {
        return name;
    }

    public Collection<ClusterSpec> clusters() {
        return clusters.values();
    }

    public Optional<ClusterSpec> cluster(Id id) {
        return Optional.ofNullable(clusters.get(id));
    }

    /** True when {@code cluster}, and {@code node} unless null, are in this topology. */
    public boolean contains(Id cluster, Id node) {
        ClusterSpec c = clusters.get(cluster);
        return c != null && (node == null || c.hasNode(node));
    }

    public int size() {
        return clusters.size();
    }

    public Set<String> zones() {
        Set<String> zones = new TreeSet<>();
        for (ClusterSpec c : clusters.values()) {
            for (NodeSpec n : c.nodes()) if (n.zone() != null) zones.add(n.zone());
        }
        return zones;
    }

    /** A copy with {@code cluster} added or replaced. */
    public Fleet withCluster(ClusterSpec cluster) {
        Map<Id, ClusterSpec> map = new LinkedHashMap<>(clusters);
        map.put(cluster.id(), cluster);
        return new Fleet(name, map);
    }
}
