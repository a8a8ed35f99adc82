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
import dev.tend.shared.fleet.FleetHealthView;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.fleet.SignalStatus;

import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Supplier;

/**
 * Publishes the engine's fleet health as an immutable {@link FleetHealth}, replaced whole
 * behind one reference after each committed batch, so HTTP threads read it without touching
 * the engine. The full picture is rebuilt only after a batch that can change health or the
 * brake (a transition, a topology event, an operator command); other batches only refresh the
 * run count and the brake.
 */
final class FleetHealthPublisher implements CommitListener, Supplier<FleetHealth> {
    private final AtomicReference<FleetHealth> current = new AtomicReference<>(FleetHealth.empty());
    private final Clock clock;
    private final double timeScale;

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
        boolean healthMayHaveChanged = false;
        for (Input in : inputs) {
            if (in instanceof Input.Transition || in instanceof Input.Topology || in instanceof Input.Command) {
                healthMayHaveChanged = true;
                break;
            }
        }
        if (healthMayHaveChanged) publish(engine);
        else current.set(current.get().withRuns(clock.instant(), engine.activeRuns(), brake(engine.brake())));
    }

    /** Rebuilds the picture; on the driver thread, or before it starts. */
    void publish(Engine engine) {
        FleetHealthView view = engine.health();
        Map<String, int[]> clustersPerZone = new TreeMap<>();
        Map<String, int[]> nodesPerZone = new TreeMap<>();
        Map<String, List<String>> unhealthyPerZone = new TreeMap<>();
        Map<String, Integer> impaired = view.impairedPerZone();
        for (ClusterSpec c : view.topology().clusters()) {
            for (String z : zones(c)) clustersPerZone.computeIfAbsent(z, k -> new int[1])[0]++;
            for (NodeSpec n : c.nodes()) nodesPerZone.computeIfAbsent(n.zone() == null ? "unknown" : n.zone(), k -> new int[1])[0]++;
        }
        List<FleetHealth.ClusterProblem> problems = new ArrayList<>();
        for (Id cluster : view.unhealthyClusters()) {
            Optional<ClusterSpec> spec = view.topology().cluster(cluster);
            List<FleetHealth.Signal> signals = new ArrayList<>();
            TreeSet<String> zones = new TreeSet<>();
            Map<Id, SignalStatus> own = view.activeSignals(cluster, null);
            own.forEach((s, st) -> signals.add(signal(null, s, st, spec.isEmpty())));
            if (!own.isEmpty()) spec.ifPresent(c -> zones.addAll(zones(c)));
            for (Id node : view.impairedNodes(cluster)) {
                boolean unknown = spec.flatMap(c -> c.node(node)).isEmpty();
                view.activeSignals(cluster, node).forEach((s, st) -> signals.add(signal(node, s, st, unknown)));
                zones.add(spec.flatMap(c -> c.node(node)).map(NodeSpec::zone).orElse("unknown"));
            }
            for (String z : zones) unhealthyPerZone.computeIfAbsent(z, k -> new ArrayList<>()).add(cluster.value());
            String health = spec.isEmpty() ? "unknown-target" : view.health(cluster).name().toLowerCase(java.util.Locale.ROOT);
            problems.add(new FleetHealth.ClusterProblem(cluster.value(), health,
                    List.copyOf(zones), signals));
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
