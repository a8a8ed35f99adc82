package dev.tend.shared.fleet;

import dev.tend.shared.Id;

import java.util.Collection;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * The fleet topology: an immutable set of clusters in file order.
 *
 * <p>{@link #withCluster} is what every topology event calls, and a fleet may hold tens of
 * thousands of clusters: copying them all for each event made a day's replay of a
 * 25,000-cluster fleet (7,446 topology events) spend 85% of its time copying maps. A fleet is
 * therefore a base map and a small overlay of the clusters changed or added since: a change
 * copies the overlay only, and once the overlay holds about the square root of the base's
 * size they are merged into a new base (DEVELOPERS.md, "Scale of what operators ask").
 * What it answers is the same either way: a changed cluster keeps its place, an added one
 * comes last.
 */
public final class Fleet {
    /** The smallest overlay that is merged into the base, for small fleets. */
    private static final int MIN_OVERLAY = 16;

    private final String name;
    /** The clusters at the last merge, in file order (unmodifiable). */
    private final Map<Id, ClusterSpec> base;
    /** Clusters changed or added since the last merge, in the order they were first added (unmodifiable). */
    private final Map<Id, ClusterSpec> overlay;
    /** How many clusters of {@link #overlay} are not in {@link #base}. */
    private final int added;
    /** Base and overlay as one map in fleet order, built when first asked for (an immutable value: a race builds it twice, no harm). */
    private Map<Id, ClusterSpec> merged;

    private Fleet(String name, Map<Id, ClusterSpec> clusters) {
        this(name, Collections.unmodifiableMap(clusters), Map.of(), 0);
    }

    private Fleet(String name, Map<Id, ClusterSpec> base, Map<Id, ClusterSpec> overlay, int added) {
        this.name = name;
        this.base = base;
        this.overlay = overlay;
        this.added = added;
        if (overlay.isEmpty()) this.merged = base;
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

    /** The clusters in fleet order: those of the file first, a changed one in its place, added ones after. */
    public Collection<ClusterSpec> clusters() {
        return merged().values();
    }

    public Optional<ClusterSpec> cluster(Id id) {
        return Optional.ofNullable(get(id));
    }

    /** True when {@code cluster}, and {@code node} unless null, are in this topology. */
    public boolean contains(Id cluster, Id node) {
        ClusterSpec c = get(cluster);
        return c != null && (node == null || c.hasNode(node));
    }

    public int size() {
        return base.size() + added;
    }

    public Set<String> zones() {
        Set<String> zones = new TreeSet<>();
        for (ClusterSpec c : clusters()) {
            for (NodeSpec n : c.nodes()) if (n.zone() != null) zones.add(n.zone());
        }
        return zones;
    }

    /**
     * A copy with {@code cluster} added or replaced: it copies the clusters changed since the
     * last merge, not the fleet (see the class comment).
     */
    public Fleet withCluster(ClusterSpec cluster) {
        Id id = cluster.id();
        boolean isNew = !base.containsKey(id) && !overlay.containsKey(id);
        Map<Id, ClusterSpec> changed = new LinkedHashMap<>(overlay);
        changed.put(id, cluster);
        int nowAdded = added + (isNew ? 1 : 0);
        if (changed.size() < Math.max(MIN_OVERLAY, (int) Math.sqrt(base.size()))) {
            return new Fleet(name, base, Collections.unmodifiableMap(changed), nowAdded);
        }
        return new Fleet(name, mergedWith(changed));
    }

    private ClusterSpec get(Id id) {
        ClusterSpec c = overlay.get(id);
        return c != null ? c : base.get(id);
    }

    private Map<Id, ClusterSpec> merged() {
        Map<Id, ClusterSpec> m = merged;
        if (m == null) {
            m = Collections.unmodifiableMap(mergedWith(overlay));
            merged = m;
        }
        return m;
    }

    /** The base with {@code changes} laid over it: a changed cluster in its place, added ones last. */
    private Map<Id, ClusterSpec> mergedWith(Map<Id, ClusterSpec> changes) {
        Map<Id, ClusterSpec> map = new LinkedHashMap<>(base);
        map.putAll(changes);
        return map;
    }
}
