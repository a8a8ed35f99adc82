package dev.tend.engine;

import dev.tend.playbooks.Actions;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Drives a real engine in virtual time for tests: feeds transitions, fires due timers in
 * time order, answers executor calls, and keeps every effect for assertions.
 */
final class EngineHarness {
    static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");
    static final String ACTIONS = """
            actions:
              drain-node: { simulated: { duration: 1m, success: 1.0 } }
              undrain-node: { simulated: { duration: 1m, success: 1.0 } }
              replace-node: { simulated: { duration: 2m, success: 1.0, clears: [heartbeat] } }
              restart-process: { simulated: { duration: 30s, success: 1.0, clears: [process-down] } }
            """;

    /** Two clusters of three nodes: fares-1 of tier critical, fares-9 of tier standard. */
    static final String TIERED_FLEET = fleet(cluster("fares-1", "critical", 3, null) + cluster("fares-9", "standard", 3, null));
    /** The replace playbook that asks a person first on critical clusters; the request lapses after 30 minutes. */
    static final String APPROVAL_PLAYBOOK = replacePlaybook("0s", "keep-replicas: false")
            .replace("steps:", "approval: { clusters: { tier: [critical] }, expires-after: 30m }\nsteps:");

    final Engine engine;
    Instant now = T0;
    final List<Effect> effects = new ArrayList<>();
    final TreeMap<String, Instant> timers = new TreeMap<>();
    final List<Effect.CallExecutor> calls = new ArrayList<>();

    EngineHarness(String fleetYaml, String tendYaml, String... playbookYamls) {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", ACTIONS);
        TendConfig config = tendYaml == null ? TendConfig.builtIn() : PlaybookLoader.parseConfig("tend.yaml", tendYaml);
        List<Playbook> playbooks = new ArrayList<>();
        for (int i = 0; i < playbookYamls.length; i++) {
            playbooks.add(PlaybookLoader.parse("p" + i + ".yaml", playbookYamls[i], actions));
        }
        Fleet fleet = FleetFile.parse("fleet.yaml", fleetYaml);
        engine = new Engine(new EngineSetup(PlaybookSet.of(playbooks, actions, config), config, fleet,
                BrakeThresholds.from(config.brake()), EventTimeMode.following(Duration.ZERO)));
    }

    List<Effect> send(Input in) {
        List<Effect> fx = engine.handle(in, now);
        effects.addAll(fx);
        for (Effect e : fx) {
            if (e instanceof Effect.Ledger l) {
                // the store numbers, times and names each entry itself: these keys are its own
                assertThat(l.fields()).as("ledger fields of " + l.kind()).doesNotContainKeys("seq", "at", "kind");
            }
            if (e instanceof Effect.ArmTimer a) timers.put(a.key(), a.due());
            else if (e instanceof Effect.CancelTimer c) timers.remove(c.key());
            else if (e instanceof Effect.CallExecutor c) calls.add(c);
        }
        return fx;
    }

    /** A transition at T0 + {@code seconds}; virtual time moves there first. */
    List<Effect> at(long seconds, String cluster, String node, String signal, SignalState state) {
        advanceTo(T0.plusSeconds(seconds));
        return send(new Input.Transition(HealthTransition.of(now, cluster, node, signal, state)));
    }

    /** Moves virtual time to {@code t}, firing every timer due on the way, in time order. */
    void advanceTo(Instant t) {
        while (true) {
            Map.Entry<String, Instant> next = null;
            for (Map.Entry<String, Instant> e : timers.entrySet()) {
                if (!e.getValue().isAfter(t) && (next == null || e.getValue().isBefore(next.getValue()))) next = e;
            }
            if (next == null) break;
            timers.remove(next.getKey());
            if (next.getValue().isAfter(now)) now = next.getValue();
            send(new Input.TimerFired(next.getKey()));
        }
        if (t.isAfter(now)) now = t;
        send(new Input.Tick());
    }

    void advance(Duration d) {
        advanceTo(now.plus(d));
    }

    /** Answers every call made so far; successful simulated calls also clear their signals. */
    void answerCalls(boolean success) {
        List<Effect.CallExecutor> pending = new ArrayList<>(calls);
        calls.clear();
        for (Effect.CallExecutor c : pending) {
            List<dev.tend.shared.Id> clears = success && c.action() instanceof dev.tend.playbooks.SimulatedAction s ? s.clears() : List.of();
            send(new Input.ExecutorResult(c.runId(), c.stepId(), c.attempt(), success, success ? "ok" : "failed", clears, Map.of()));
            for (dev.tend.shared.Id sig : clears) {
                send(new Input.Transition(new HealthTransition(now, c.target().cluster(), c.target().node(), sig,
                        SignalState.CLEAR, Map.of(), Map.of())));
            }
        }
    }

    /** Runs calls to completion until no call is pending (bounded). */
    void settle() {
        for (int i = 0; i < 50 && !calls.isEmpty(); i++) {
            advance(Duration.ofSeconds(30));
            answerCalls(true);
        }
    }

    List<Map<String, Object>> ledger(String kind) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (Effect e : effects) if (e instanceof Effect.Ledger l && l.kind().equals(kind)) out.add(l.fields());
        return out;
    }

    /** The verdicts ledgered so far, as "verdict [reasons]" strings, for the given cluster. */
    List<String> verdicts(String cluster) {
        List<String> out = new ArrayList<>();
        for (Map<String, Object> v : ledger("verdict")) {
            if (cluster.equals(v.get("cluster"))) out.add(v.get("verdict") + " " + v.get("reasons"));
        }
        return out;
    }

    Map<String, Object> lastVerdict(String cluster) {
        Map<String, Object> last = null;
        for (Map<String, Object> v : ledger("verdict")) if (cluster.equals(v.get("cluster"))) last = v;
        return last;
    }

    long notifications() {
        return effects.stream().filter(e -> e instanceof Effect.Notify).count();
    }

    static String fleet(String clustersYaml) {
        return "fleet: larkspur\nclusters:\n" + clustersYaml;
    }

    static String cluster(String id, String tier, int nodes, String extra) {
        StringBuilder sb = new StringBuilder("  - id: " + id + "\n    tags: { tier: " + tier + " }\n");
        if (extra != null) sb.append("    ").append(extra).append('\n');
        sb.append("    nodes:\n");
        String[] zones = {"z-a", "z-b", "z-c"};
        for (int i = 1; i <= nodes; i++) sb.append("      - { id: n").append(i).append(", zone: ").append(zones[(i - 1) % 3]).append(" }\n");
        return sb.toString();
    }

    static String replacePlaybook(String confirm, String limits) {
        return """
                playbook: replace-silent-node
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: %s }
                limits: { %s }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: replace, action: replace-node, timeout: 30m }
                  - { id: settle, wait-healthy: [heartbeat], within: 20m }
                on-failure:
                  - { page: oncall, message: "replacing {node} in {cluster} failed at {step}" }
                """.formatted(confirm, limits);
    }

    /** The run of the first approval requested. */
    String pendingRun() {
        return (String) ledger("approval-requested").get(0).get("run");
    }
}
