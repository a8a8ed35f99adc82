package dev.tend.runtime;

import dev.tend.shared.ApprovalState;
import dev.tend.shared.RunState;
import dev.tend.engine.ApprovalSnapshot;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.engine.RunSnapshot;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.Target;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.NodeSpec;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.TreeMap;

/**
 * Makes a random but valid stream of inputs for an engine, reacting to what it did: the
 * timers it armed fire at their time, its executor calls are answered (mostly with
 * success), its approval requests are approved or rejected, and operators exclude, brake
 * and abort now and then. Transitions fall on a few dozen clusters of the fleet so that the
 * fleet brake, caps and loops come into play; now and then the trigger of a running run
 * clears, a mask or an exclusion lands on its target (its gate may stand it down), and a few
 * nodes flap. Seeded: the same seed, the same inputs.
 */
final class RandomInputs {
    /** One input and the processing time it is handled at. */
    record Step(Input input, Instant now) {
    }

    private static final String[] SIGNALS = {"heartbeat", "process-down", "replica-lag", "cert-expiry", "storage-full"};
    /** The trigger signal of each playbook of the bundled library, by playbook id. */
    private static final Map<String, String> TRIGGERS = Map.of("replace-silent-node", "heartbeat",
            "restart-stopped-process", "process-down", "move-leadership-off-lagging-node", "replica-lag",
            "rotate-expiring-certificate", "cert-expiry");

    private final Random random;
    private final List<ClusterSpec> clusters;
    private Instant now;
    private Instant eventAt;
    private final TreeMap<String, Instant> timers = new TreeMap<>();
    private final Map<String, Effect.CallExecutor> calls = new LinkedHashMap<>();
    private final Map<String, ApprovalSnapshot> pending = new LinkedHashMap<>();
    private final Map<String, RunSnapshot> active = new LinkedHashMap<>();
    /** Inputs left in the current burst of flaps, and the node that flaps. */
    private int flapsLeft;
    private ClusterSpec flapping;
    private SignalState flapState = SignalState.CLEAR;

    RandomInputs(long seed, Fleet fleet, int clusterCount, Instant start) {
        this.random = new Random(seed);
        List<ClusterSpec> all = new ArrayList<>(fleet.clusters());
        this.clusters = all.subList(0, Math.min(clusterCount, all.size()));
        this.now = start;
        this.eventAt = start;
    }

    /** Takes note of what the engine did with the last input: timers, calls, approvals, runs. */
    void observe(List<Effect> effects) {
        for (Effect e : effects) {
            if (e instanceof Effect.ArmTimer a) timers.put(a.key(), a.due());
            else if (e instanceof Effect.CancelTimer c) timers.remove(c.key());
            else if (e instanceof Effect.CallExecutor c) calls.put(c.key(), c);
            else if (e instanceof Effect.ApprovalChanged a) {
                if (a.approval().state() == ApprovalState.PENDING) pending.put(a.approval().runId(), a.approval());
                else pending.remove(a.approval().runId());
            } else if (e instanceof Effect.RunChanged r) {
                if (r.run().state().isActive()) active.put(r.run().runId(), r.run());
                else active.remove(r.run().runId());
            }
        }
    }

    /** The next input, given what the engine has done so far. */
    Step next() {
        now = now.plusSeconds(random.nextInt(45));
        if (flapsLeft > 0) {
            flapsLeft--;
            return new Step(Input.Transition.withWire(flap()), now);
        }
        int roll = random.nextInt(100);
        if (roll < 12 && !timers.isEmpty()) {
            Map.Entry<String, Instant> first = timers.firstEntry();
            for (Map.Entry<String, Instant> t : timers.entrySet()) if (t.getValue().isBefore(first.getValue())) first = t;
            timers.remove(first.getKey());
            if (first.getValue().isAfter(now)) now = first.getValue();
            return new Step(new Input.TimerFired(first.getKey()), now);
        }
        if (roll < 27 && !calls.isEmpty()) {
            Effect.CallExecutor c = pick(new ArrayList<>(calls.values()));
            calls.remove(c.key());
            boolean ok = random.nextInt(10) < 8;
            List<Id> clears = ok && c.action() instanceof dev.tend.playbooks.SimulatedAction s ? s.clears() : List.of();
            return new Step(new Input.ExecutorResult(c.runId(), c.stepId(), c.attempt(), ok, ok ? "ok" : "failed", clears,
                    Map.of("try", random.nextInt(3))), now);
        }
        if (roll < 31) return new Step(command(), now);
        if (roll < 34) return new Step(new Input.Topology(topology()), now);
        if (roll < 40) {
            now = now.plus(Duration.ofSeconds(random.nextInt(900)));
            return new Step(new Input.Tick(), now);
        }
        if (roll < 45) {
            List<RunSnapshot> running = active.values().stream().filter(r -> r.state() == dev.tend.shared.RunState.RUNNING).toList();
            if (!running.isEmpty()) return new Step(gateInput(pick(running)), now);
        }
        if (roll < 47) {
            flapping = clusters.get(random.nextInt(Math.min(3, clusters.size())));
            flapsLeft = 8;
            return new Step(Input.Transition.withWire(flap()), now);
        }
        return new Step(Input.Transition.withWire(transition()), now);
    }

    private HealthTransition transition() {
        eventAt = eventAt.plusSeconds(random.nextInt(90));
        if (eventAt.isAfter(now)) eventAt = now;
        // now and then a late event, older than what was already seen
        Instant at = random.nextInt(20) == 0 ? eventAt.minusSeconds(60 + random.nextInt(600)) : eventAt;
        ClusterSpec c = pick(clusters);
        if (random.nextInt(25) == 0) {
            return HealthTransition.of(at, c.id().value(), null, "key-revoked", random.nextBoolean() ? SignalState.BREACH : SignalState.CLEAR);
        }
        NodeSpec n = pick(c.nodes());
        String signal = SIGNALS[random.nextInt(SIGNALS.length)];
        int s = random.nextInt(10);
        SignalState state = s < 4 ? SignalState.CLEAR : signal.equals("heartbeat") || s < 6 ? SignalState.SILENT : SignalState.BREACH;
        return HealthTransition.of(at, c.id().value(), n.id().value(), signal, state);
    }

    /** Something that a running run's gate looks at before its next action step. */
    private Input gateInput(RunSnapshot run) {
        eventAt = eventAt.plusSeconds(random.nextInt(30));
        if (eventAt.isAfter(now)) eventAt = now;
        Target t = run.target();
        String node = t.node() == null ? null : t.node().value();
        int r = random.nextInt(4);
        if (r == 0) return new Input.Exclude(t, "checking by hand", "ops", now.plusSeconds(300 + random.nextInt(3600)), "olga", "127.0.0.1");
        if (r == 1 && node != null) {
            return Input.Transition.withWire(HealthTransition.of(eventAt, t.cluster().value(), node, "storage-full", SignalState.BREACH));
        }
        String signal = TRIGGERS.getOrDefault(run.playbook(), SIGNALS[random.nextInt(SIGNALS.length)]);
        return Input.Transition.withWire(HealthTransition.of(eventAt, t.cluster().value(), node, signal, SignalState.CLEAR));
    }

    /** The next state change of process-down in a burst on one node, back and forth: the node flaps. */
    private HealthTransition flap() {
        eventAt = now;
        flapState = flapState == SignalState.CLEAR ? SignalState.BREACH : SignalState.CLEAR;
        return HealthTransition.of(eventAt, flapping.id().value(), flapping.nodes().get(0).id().value(), "process-down", flapState);
    }

    private TopologyEvent topology() {
        ClusterSpec c = pick(clusters);
        int r = random.nextInt(3);
        TopologyChange change = r == 0 ? TopologyChange.JOINED : r == 1 ? TopologyChange.LEFT : TopologyChange.CHANGED;
        Id node = r == 0 ? Id.of("n" + (7 + random.nextInt(3))) : pick(c.nodes()).id();
        Map<String, Object> attrs = change == TopologyChange.LEFT ? Map.of() : Map.of("zone", "z-" + "abc".charAt(random.nextInt(3)));
        return new TopologyEvent(eventAt, c.id(), node, change, attrs, Map.of());
    }

    private Input command() {
        String by = random.nextBoolean() ? "olga" : "anna";
        String from = "127.0.0.1";
        int r = random.nextInt(9);
        if (r <= 1 && !pending.isEmpty()) {
            ApprovalSnapshot a = pick(new ArrayList<>(pending.values()));
            return r == 0 ? new Input.Approve(a.runId(), by, from) : new Input.Reject(a.runId(), "not tonight", by, from);
        }
        if (r == 2 && !active.isEmpty()) return new Input.AbortRun(pick(new ArrayList<>(active.keySet())), "rehearsal", by, from);
        ClusterSpec c = pick(clusters);
        Target t = random.nextBoolean() ? Target.cluster(c.id()) : Target.node(c.id(), pick(c.nodes()).id());
        return switch (r) {
            case 3 -> new Input.Exclude(t, "vendor maintenance", "ops", random.nextBoolean() ? null : now.plusSeconds(600 + random.nextInt(7200)),
                    by, from);
            case 4 -> new Input.Unexclude(t, by, from);
            // a drill now and then only: an engaged brake would hide the automatic one most of the time
            case 5 -> random.nextInt(4) == 0 ? new Input.EngageBrake("storm drill", by, from)
                    : new Input.ClearLoop(Id.of("replace-silent-node"), t, by, from);
            case 6 -> new Input.ReleaseBrake("drill over", by, from);
            default -> new Input.ClearLoop(Id.of("replace-silent-node"), t, by, from);
        };
    }

    private <T> T pick(List<T> list) {
        return list.get(random.nextInt(list.size()));
    }

    /** Handles {@code step} on {@code engine}. */
    static List<Effect> handle(Engine engine, Step step) {
        return engine.handle(step.input(), step.now());
    }
}
