package dev.tend.serve;

import dev.tend.api.view.BrakeView;
import dev.tend.api.view.FleetHealth;
import dev.tend.engine.BrakeState;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.runtime.CommitListener;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetHealthView;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.fleet.SignalStatus;

import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.function.Supplier;

/**
 * Publishes the engine's fleet health as an immutable {@link FleetHealth} for HTTP threads,
 * which never touch the engine. After each committed batch the driver thread looks again only
 * at the clusters the batch's transitions and topology events name, and keeps what it found
 * per cluster; the picture is assembled from those entries when it is next
 * asked for, once per change. A topology event changes the counts per zone by what its
 * cluster counted before and counts now. So a commit costs what it touched, not the fleet's
 * size (a fleet of 25,000 clusters took milliseconds for each topology event when every
 * cluster was counted again), and a reader always sees the state after a whole batch (the
 * entries and the figures change together, under one lock).
 */
final class FleetHealthPublisher implements CommitListener, Supplier<FleetHealth> {
    private final Clock clock;
    private final Object lock = new Object();
    // guarded by lock: written by the driver thread, read by whoever asks for the picture
    private Fleet topology;
    /** The engine the entries were kept for: another one (rebuilt, or taken over) is counted whole again. */
    private Engine engineSeen;
    /**
     * The clusters as the counts per zone count them (the topology at the last whole count, with
     * each cluster a topology event named since as it was after its batch); the driver's only.
     */
    private Fleet counted;
    private Map<String, int[]> clustersPerZone = new TreeMap<>();
    /** Each zone's own nodes (a cluster usually has nodes in several zones). */
    private Map<String, int[]> nodesPerZone = new TreeMap<>();
    /** Unhealthy clusters, by id, with what the picture shows of each (ordered by id when assembled, not at every commit). */
    private final HashMap<Id, Unhealthy> unhealthy = new HashMap<>();
    private Figures figures;
    /** The picture of the entries and figures above; null until it is asked for again after a change. */
    private FleetHealth picture = FleetHealth.empty();

    /** One unhealthy cluster: its entry in the picture and its impaired nodes per zone. */
    private record Unhealthy(FleetHealth.ClusterProblem problem, Map<String, Integer> impairedPerZone) {
    }

    /** The picture's figures besides the clusters. */
    private record Figures(Instant at, Instant eventTime, String fleet, int clusters, int unhealthy, double fraction,
                           int activeRuns, BrakeView brake) {
        Figures withRuns(Instant newAt, int newActiveRuns, BrakeView newBrake) {
            return new Figures(newAt, eventTime, fleet, clusters, unhealthy, fraction, newActiveRuns, newBrake);
        }
    }

    /** How many times faster than the wall clock processing time runs (1 live; more under tend demo). */
    private final double timeScale;

    FleetHealthPublisher(Clock clock) {
        this(clock, 1);
    }

    FleetHealthPublisher(Clock clock, double timeScale) {
        this.clock = clock;
        this.timeScale = timeScale;
    }

    @Override
    public FleetHealth get() {
        synchronized (lock) {
            if (picture == null) picture = assemble();
            return picture;
        }
    }

    @Override
    public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
        Set<Id> touched = new HashSet<>();
        Set<Id> moved = new HashSet<>();
        boolean refigure = false;
        FleetHealthView view = engine.health();
        for (Input in : inputs) {
            if (in instanceof Input.Transition t) {
                refigure = true; // the figures change (the event time) even when no entry does
                if (mayHaveChanged(view, t.transition())) touched.add(t.transition().cluster());
            } else if (in instanceof Input.Topology t) {
                refigure = true;
                moved.add(t.event().cluster());
            } else if (in instanceof Input.Command) {
                refigure = true;
            }
        }
        boolean sameEngine;
        Fleet seen;
        synchronized (lock) {
            sameEngine = engine == engineSeen;
            seen = topology;
        }
        if (!sameEngine || counted == null || (view.topology() != seen && moved.isEmpty())) {
            publish(engine); // what changed the topology is not in this batch: count it whole
        } else if (refigure) {
            Map<String, int[]> perZone = null;
            Map<String, int[]> nodes = null;
            if (!moved.isEmpty()) {
                perZone = copy(clustersPerZone);
                nodes = copy(nodesPerZone);
                for (Id cluster : moved) {
                    ClusterSpec now = view.topology().cluster(cluster).orElse(null);
                    count(perZone, nodes, counted.cluster(cluster).orElse(null), -1);
                    count(perZone, nodes, now, +1);
                    if (now != null) counted = counted.withCluster(now);
                }
                touched.addAll(moved); // a cluster's entry shows its nodes' zones
            }
            Map<Id, Unhealthy> found = new HashMap<>();
            for (Id cluster : touched) found.put(cluster, entry(view, cluster));
            Figures f = figures(engine);
            synchronized (lock) {
                found.forEach((cluster, u) -> {
                    if (u == null) unhealthy.remove(cluster);
                    else unhealthy.put(cluster, u);
                });
                if (perZone != null) {
                    clustersPerZone = perZone;
                    nodesPerZone = nodes;
                    topology = view.topology();
                }
                figures = f;
                picture = null;
            }
        } else {
            Instant at = clock.instant();
            int runs = engine.activeRuns();
            BrakeView brake = brake(engine.brake());
            synchronized (lock) {
                figures = figures.withRuns(at, runs, brake);
                if (picture != null) picture = picture.withRuns(at, runs, brake);
            }
        }
    }

    /**
     * Whether {@code t} may have changed its cluster's entry: a transition that changed its
     * signal's state left the signal's {@code since} at its own time. One that repeated the
     * state (most of a pipeline's traffic) or came late did not, and its cluster is not looked
     * at again; when in doubt (the same instant, or no signal kept) it is.
     */
    private static boolean mayHaveChanged(FleetHealthView view, HealthTransition t) {
        Optional<SignalStatus> now = view.status(t.key());
        return now.isEmpty() || now.get().since().equals(t.at());
    }

    /** Rebuilds every entry; on the driver thread, or before it starts. */
    void publish(Engine engine) {
        FleetHealthView view = engine.health();
        Map<String, int[]> perZone = new TreeMap<>();
        Map<String, int[]> nodes = new TreeMap<>();
        for (ClusterSpec c : view.topology().clusters()) count(perZone, nodes, c, +1);
        Map<Id, Unhealthy> all = new HashMap<>();
        for (Id cluster : view.unhealthyClusters()) all.put(cluster, entry(view, cluster));
        Figures f = figures(engine);
        counted = view.topology();
        synchronized (lock) {
            engineSeen = engine;
            topology = view.topology();
            clustersPerZone = perZone;
            nodesPerZone = nodes;
            unhealthy.clear();
            unhealthy.putAll(all);
            figures = f;
            picture = null;
        }
    }

    private Figures figures(Engine engine) {
        FleetHealthView view = engine.health();
        // before the first event the engine's event time is the epoch: "none yet"
        Instant eventTime = engine.eventTime().equals(Instant.EPOCH) ? null : engine.eventTime();
        return new Figures(clock.instant(), eventTime, view.topology().name(), view.topology().size(), view.unhealthyClusterCount(),
                view.unhealthyFraction(), engine.activeRuns(), brake(engine.brake()));
    }

    /** What the picture shows of one cluster; null when it is healthy. */
    private static Unhealthy entry(FleetHealthView view, Id cluster) {
        if (!view.isUnhealthy(cluster)) return null;
        Optional<ClusterSpec> spec = view.topology().cluster(cluster);
        List<FleetHealth.Signal> signals = new ArrayList<>();
        TreeSet<String> zones = new TreeSet<>();
        Map<String, Integer> impaired = new TreeMap<>();
        Map<Id, SignalStatus> own = view.activeSignals(cluster, null);
        own.forEach((s, st) -> signals.add(signal(null, s, st, spec.isEmpty())));
        if (!own.isEmpty()) spec.ifPresent(c -> zones.addAll(zones(c)));
        for (Id node : view.impairedNodes(cluster)) {
            Optional<NodeSpec> n = spec.flatMap(c -> c.node(node));
            view.activeSignals(cluster, node).forEach((s, st) -> signals.add(signal(node, s, st, n.isEmpty())));
            String zone = n.map(NodeSpec::zone).orElse("unknown");
            zones.add(zone);
            impaired.merge(zone, 1, Integer::sum);
        }
        String health = spec.isEmpty() ? "unknown-target" : view.health(cluster).name().toLowerCase(java.util.Locale.ROOT);
        return new Unhealthy(new FleetHealth.ClusterProblem(cluster.value(), health, List.copyOf(zones), signals), impaired);
    }

    /** The picture of the kept entries and figures; under the lock. */
    private FleetHealth assemble() {
        Map<String, List<String>> unhealthyPerZone = new TreeMap<>();
        Map<String, Integer> impaired = new TreeMap<>();
        List<FleetHealth.ClusterProblem> problems = new ArrayList<>(unhealthy.size());
        for (Unhealthy u : new TreeMap<>(unhealthy).values()) {
            problems.add(u.problem());
            for (String z : u.problem().zones()) unhealthyPerZone.computeIfAbsent(z, k -> new ArrayList<>()).add(u.problem().cluster());
            u.impairedPerZone().forEach((z, n) -> impaired.merge(z, n, Integer::sum));
        }
        TreeSet<String> allZones = new TreeSet<>(clustersPerZone.keySet());
        allZones.addAll(unhealthyPerZone.keySet());
        List<FleetHealth.Zone> zones = new ArrayList<>();
        for (String z : allZones) {
            zones.add(new FleetHealth.Zone(z, nodesPerZone.getOrDefault(z, new int[1])[0], clustersPerZone.getOrDefault(z, new int[1])[0],
                    unhealthyPerZone.getOrDefault(z, List.of()), impaired.getOrDefault(z, 0)));
        }
        Figures f = figures;
        return new FleetHealth(f.at(), f.eventTime(), f.fleet(), f.clusters(), f.unhealthy(), f.fraction(), f.activeRuns(),
                f.brake(), zones, problems, timeScale, null);
    }

    /** Adds {@code c}'s zones and nodes to the counts ({@code sign} +1), or takes them away (-1); a zone counted to 0 goes. */
    private static void count(Map<String, int[]> perZone, Map<String, int[]> nodes, ClusterSpec c, int sign) {
        if (c == null) return;
        for (String z : zones(c)) add(perZone, z, sign);
        for (NodeSpec n : c.nodes()) add(nodes, n.zone() == null ? "unknown" : n.zone(), sign);
    }

    private static void add(Map<String, int[]> counts, String zone, int by) {
        int[] n = counts.computeIfAbsent(zone, k -> new int[1]);
        n[0] += by;
        if (n[0] == 0) counts.remove(zone);
    }

    /** A copy to change while readers go on with the original under the lock. */
    private static Map<String, int[]> copy(Map<String, int[]> counts) {
        Map<String, int[]> c = new TreeMap<>();
        counts.forEach((zone, n) -> c.put(zone, new int[]{n[0]}));
        return c;
    }

    private static List<String> zones(ClusterSpec c) {
        TreeSet<String> z = new TreeSet<>();
        for (NodeSpec n : c.nodes()) z.add(n.zone() == null ? "unknown" : n.zone());
        return List.copyOf(z);
    }

    private static FleetHealth.Signal signal(Id node, Id signal, SignalStatus s, boolean unknownTarget) {
        return new FleetHealth.Signal(node == null ? null : node.value(), signal.value(), s.state().wireName(), s.since(),
                unknownTarget);
    }

    static BrakeView brake(BrakeState b) {
        return new BrakeView(b.engaged(), b.since(), b.by(), b.reason(), b.manual());
    }
}
