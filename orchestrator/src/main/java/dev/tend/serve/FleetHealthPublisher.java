package dev.tend.serve;

import dev.tend.api.view.BrakeView;
import dev.tend.api.view.FleetHealth;
import dev.tend.engine.BrakeState;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.runtime.CommitListener;
import dev.tend.shared.Id;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetHealthView;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.fleet.SignalStatus;

import java.time.Clock;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Supplier;

/**
 * Publishes the engine's fleet health as an immutable {@link FleetHealth}, replaced whole
 * behind one reference after each committed batch, so HTTP threads read it without touching
 * the engine. Kept up to date by cluster: after a batch of transitions only the clusters they
 * name are looked at again (what the topology says per zone is kept until the topology
 * changes), so a batch costs what it touched, not the fleet's size. A topology event rebuilds
 * the whole picture; batches without transitions refresh the run count, the brake and event
 * time.
 */
final class FleetHealthPublisher implements CommitListener, Supplier<FleetHealth> {
    private final AtomicReference<FleetHealth> current = new AtomicReference<>(FleetHealth.empty());
    private final Clock clock;
    /** The topology the zone counts below were made for; driver thread only, like everything below. */
    private Fleet topology;
    private Map<String, int[]> clustersPerZone = new TreeMap<>();
    /** Each zone's own nodes (a cluster usually has nodes in several zones). */
    private Map<String, int[]> nodesPerZone = new TreeMap<>();
    /** How many times faster than the wall clock processing time runs (1 live; more under tend demo). */
    private final double timeScale;
    /** Unhealthy clusters, by id, with what the picture shows of each. */
    private final TreeMap<Id, Unhealthy> unhealthy = new TreeMap<>();

    /** One unhealthy cluster: its entry in the picture and its impaired nodes per zone. */
    private record Unhealthy(FleetHealth.ClusterProblem problem, Map<String, Integer> impairedPerZone) {
    }

    FleetHealthPublisher(Clock clock) {
        this(clock, 1);
    }

    FleetHealthPublisher(Clock clock, double timeScale) {
        this.clock = clock;
        this.timeScale = timeScale;
    }

    @Override
    public FleetHealth get() {
        return current.get();
    }

    @Override
    public void committed(Engine engine, List<Input> inputs, List<Effect> effects) {
        Set<Id> touched = new HashSet<>();
        boolean rebuild = false;
        boolean other = false;
        for (Input in : inputs) {
            if (in instanceof Input.Transition t) touched.add(t.transition().cluster());
            else if (in instanceof Input.Topology) rebuild = true;
            else if (in instanceof Input.Command) other = true;
        }
        if (rebuild || engine.health().topology() != topology) {
            publish(engine);
        } else if (!touched.isEmpty() || other) {
            FleetHealthView view = engine.health();
            for (Id cluster : touched) refresh(view, cluster);
            assemble(engine);
        } else {
            current.set(current.get().withRuns(clock.instant(), engine.activeRuns(), brake(engine.brake())));
        }
    }

    /** Rebuilds the picture; on the driver thread, or before it starts. */
    void publish(Engine engine) {
        FleetHealthView view = engine.health();
        topology = view.topology();
        clustersPerZone = new TreeMap<>();
        nodesPerZone = new TreeMap<>();
        for (ClusterSpec c : topology.clusters()) {
            for (String z : zones(c)) clustersPerZone.computeIfAbsent(z, k -> new int[1])[0]++;
            for (NodeSpec n : c.nodes()) nodesPerZone.computeIfAbsent(n.zone() == null ? "unknown" : n.zone(), k -> new int[1])[0]++;
        }
        unhealthy.clear();
        for (Id cluster : view.unhealthyClusters()) refresh(view, cluster);
        assemble(engine);
    }

    /** Looks at one cluster again: its entry, or none when it is healthy. */
    private void refresh(FleetHealthView view, Id cluster) {
        if (!view.isUnhealthy(cluster)) {
            unhealthy.remove(cluster);
            return;
        }
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
        unhealthy.put(cluster, new Unhealthy(new FleetHealth.ClusterProblem(cluster.value(), health, List.copyOf(zones), signals),
                impaired));
    }

    /** The picture from the kept entries. */
    private void assemble(Engine engine) {
        FleetHealthView view = engine.health();
        Map<String, List<String>> unhealthyPerZone = new TreeMap<>();
        Map<String, Integer> impaired = new TreeMap<>();
        List<FleetHealth.ClusterProblem> problems = new ArrayList<>(unhealthy.size());
        for (Unhealthy u : unhealthy.values()) {
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
        // before the first event the engine's event time is the epoch: "none yet"
        java.time.Instant eventTime = engine.eventTime().equals(java.time.Instant.EPOCH) ? null : engine.eventTime();
        current.set(new FleetHealth(clock.instant(), eventTime, view.topology().name(), view.topology().size(),
                view.unhealthyClusterCount(), view.unhealthyFraction(), engine.activeRuns(), brake(engine.brake()),
                zones, problems, timeScale));
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
