package dev.tend.handover;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.engine.RunSnapshot;
import dev.tend.executor.Executor;
import dev.tend.executor.SimulatedOutcome;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.runtime.Notifier;
import dev.tend.runtime.Orchestrator;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.Target;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.time.Timers;
import dev.tend.shared.time.VirtualClock;
import dev.tend.store.Store;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.TreeMap;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.function.Consumer;

/**
 * Runs the real orchestrator (engine, journal, projections, ledger) on a SQLite store in
 * virtual time, for handover tests: the clock moves only when told; timers fire and
 * simulated actions answer (with the outcome model of {@link SimulatedOutcome}, after their
 * simulated duration) in time order as it moves. The Larkspur clusters here are invented.
 */
final class NightShift implements AutoCloseable {
    static final String ACTIONS = """
            actions:
              drain-node: { simulated: { duration: 1m, success: 1.0 } }
              replace-node: { simulated: { duration: 4m, success: 1.0, clears: [heartbeat] } }
              restart-process: { simulated: { duration: 30s, success: 0.0 } }
            """;
    // no wait-healthy step: one that has to wait is ledgered with a field named "kind", which the store refuses
    static final String REPLACE = """
            playbook: replace-silent-node
            version: 1
            trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 0s }
            approval: { clusters: { tier: [critical] }, expires-after: 2h }
            steps:
              - { id: drain, action: drain-node, timeout: 10m }
              - { id: replace, action: replace-node, timeout: 30m }
            on-failure:
              - { page: oncall, message: "replacing {node} in {cluster} failed at {step}" }
            """;
    static final String RESTART = """
            playbook: restart-stopped-process
            version: 1
            trigger: { signal: process-down, state: breach, scope: node, confirm-for: 0s }
            steps:
              - { id: restart, action: restart-process, timeout: 5m }
            on-failure:
              - { page: oncall, message: "restarting on {node} in {cluster} failed at {step}" }
            """;

    final Path db;
    final VirtualClock clock;
    final Store store;
    private final Orchestrator orch;
    private final Map<String, Instant> timers = new TreeMap<>();
    private final List<Answer> answers = new ArrayList<>();
    private long order;

    /** A fleet at {@code start} with the two playbooks above and {@code morePlaybooks} (YAML texts). */
    NightShift(Path db, Instant start, String... morePlaybooks) {
        this.db = db;
        this.clock = VirtualClock.at(start);
        this.store = Store.openSqlite(db);
        Actions actions = PlaybookLoader.parseActions("actions.yaml", ACTIONS);
        TendConfig config = TendConfig.builtIn();
        List<Playbook> playbooks = new ArrayList<>(List.of(PlaybookLoader.parse("replace-silent-node.yaml", REPLACE, actions),
                PlaybookLoader.parse("restart-stopped-process.yaml", RESTART, actions)));
        for (int i = 0; i < morePlaybooks.length; i++) playbooks.add(PlaybookLoader.parse("more-" + i + ".yaml", morePlaybooks[i], actions));
        EngineSetup setup = new EngineSetup(PlaybookSet.of(playbooks, actions, config), config,
                FleetFile.parse("fleet.yaml", fleet()), BrakeThresholds.from(config.brake()), EventTimeMode.eventsOnly());
        Timers virtualTimers = new Timers() {
            @Override
            public void arm(String key, Instant due) {
                timers.put(key, due);
            }

            @Override
            public void cancel(String key) {
                timers.remove(key);
            }
        };
        this.orch = new Orchestrator(store, setup, Map.of("simulated", new VirtualSimulated()), virtualTimers, n -> { }, clock);
    }

    static final Instant EVENING = Instant.parse("2027-03-13T21:00:00Z");
    static final Instant SINCE = Instant.parse("2027-03-13T22:00:00Z");
    static final Instant UNTIL = Instant.parse("2027-03-14T06:00:00Z");
    static final String VENDOR_NOTE = "storage vendor incident, see https://status.larkspur.example/incidents/311";

    /**
     * One scripted night on the Larkspur fleet, from 21:00 to 06:00 UTC. Before the handover
     * period: fares-1/n1 is replaced (succeeded 21:05). In [22:00, 06:00): fares-2/n1 replaced
     * (succeeded); fares-10/n1 asks a person at 22:50, nobody answers, the approval lapses at
     * 00:50 (run cancelled); fares-3/n2 replaced (succeeded); fares-7 excluded by ana at 23:30,
     * its silent node denied at 23:40; the restart on fares-4/n1 fails at 00:15; ana engages
     * the brake for a drill 02:00 to 02:30 (ben releases it); the drain on fares-6/n1 is lost
     * at 03:00 and the run waits for a person; fares-9/n1 asks a person at 04:30 (still pending
     * at 06:00); ana engages the brake at 05:00 and leaves it on; fares-5/n3 is held by it at 05:15.
     */
    static NightShift overnight(Path db) throws InterruptedException {
        NightShift n = new NightShift(db, EVENING);
        n.silent("fares-1", "n1");
        n.advanceTo(at("22:30"));
        n.silent("fares-2", "n1");
        n.advanceTo(at("22:50"));
        n.silent("fares-10", "n1");
        n.advanceTo(at("23:10"));
        n.silent("fares-3", "n2");
        n.advanceTo(at("23:30"));
        n.exclude("fares-7", "ana", "owner migrating brokers");
        n.advanceTo(at("23:40"));
        n.silent("fares-7", "n2");
        n.advanceTo(at("00:15"));
        n.signal("fares-4", "n1", "process-down", SignalState.BREACH);
        n.advanceTo(at("02:00"));
        n.engageBrake("ana", "drill");
        n.advanceTo(at("02:30"));
        n.releaseBrake("ben", "drill over");
        n.advanceTo(at("03:00"));
        n.silent("fares-6", "n1");
        n.advanceTo(at("03:00:20"));
        n.loseCallOn("fares-6");
        n.advanceTo(at("04:30"));
        n.silent("fares-9", "n1");
        n.advanceTo(at("05:00"));
        n.engageBrake("ana", VENDOR_NOTE);
        n.advanceTo(at("05:15"));
        n.silent("fares-5", "n3");
        n.advanceTo(UNTIL);
        return n;
    }

    /** A time of the scripted night: 21:00 to 23:59 on the 13th, 00:00 to 09:59 on the 14th (UTC). */
    static Instant at(String time) {
        String t = time.length() == 5 ? time + ":00" : time;
        return Instant.parse((t.compareTo("12") > 0 ? "2027-03-13T" : "2027-03-14T") + t + "Z");
    }

    /** fares-1 to fares-8 are standard, fares-9 and fares-10 critical (their runs ask a person); three nodes each. */
    private static String fleet() {
        StringBuilder sb = new StringBuilder("fleet: larkspur\nclusters:\n");
        for (int c = 1; c <= 10; c++) {
            sb.append("  - id: fares-").append(c).append("\n    tags: { tier: ").append(c >= 9 ? "critical" : "standard")
                    .append(" }\n    nodes:\n");
            for (int n = 1; n <= 3; n++) sb.append("      - { id: n").append(n).append(", zone: z-").append((char) ('a' + n - 1)).append(" }\n");
        }
        return sb.toString();
    }

    /** Moves virtual time to {@code t}, firing timers and answering calls due on the way, in time order. */
    void advanceTo(Instant t) throws InterruptedException {
        while (true) {
            String timer = null;
            Instant due = null;
            for (Map.Entry<String, Instant> e : timers.entrySet()) {
                if (!e.getValue().isAfter(t) && (due == null || e.getValue().isBefore(due))) {
                    timer = e.getKey();
                    due = e.getValue();
                }
            }
            Answer answer = null;
            for (Answer a : answers) {
                if (a.due.isAfter(t)) continue;
                if (answer == null || a.due.isBefore(answer.due) || a.due.equals(answer.due) && a.order < answer.order) answer = a;
            }
            if (answer != null && (due == null || !answer.due.isAfter(due))) {
                answers.remove(answer);
                clock.advanceTo(answer.due);
                answer.deliver();
            } else if (timer != null) {
                timers.remove(timer);
                clock.advanceTo(due);
                orch.submit(new Input.TimerFired(timer));
            } else {
                break;
            }
            settle();
        }
        clock.advanceTo(t);
    }

    void advance(Duration d) throws InterruptedException {
        advanceTo(clock.instant().plus(d));
    }

    /** A transition of {@code signal} on {@code cluster}/{@code node} now, then everything it leads to that is due now. */
    void signal(String cluster, String node, String signal, SignalState state) throws InterruptedException {
        orch.submitEvent(new Input.Transition(HealthTransition.of(clock.instant(), cluster, node, signal, state)));
        settle();
    }

    void silent(String cluster, String node) throws InterruptedException {
        signal(cluster, node, "heartbeat", SignalState.SILENT);
    }

    void command(Input.Command c) throws InterruptedException {
        orch.submit(c);
        settle();
    }

    void engageBrake(String by, String reason) throws InterruptedException {
        command(new Input.EngageBrake(reason, by, "cli"));
    }

    void releaseBrake(String by, String reason) throws InterruptedException {
        command(new Input.ReleaseBrake(reason, by, "cli"));
    }

    void exclude(String cluster, String by, String reason) throws InterruptedException {
        command(new Input.Exclude(Target.cluster(Id.of(cluster)), reason, "payments", null, by, "cli"));
    }

    /**
     * The call in flight for the run on {@code cluster} never answers, as after a crash of an
     * executor that cannot be asked again: the run stops for a person (what recovery does).
     */
    void loseCallOn(String cluster) throws InterruptedException {
        Iterator<Answer> it = answers.iterator();
        while (it.hasNext()) {
            Answer a = it.next();
            if (a.call.target().cluster().value().equals(cluster)) {
                it.remove();
                orch.submit(new Input.OutcomeUnknown(a.call.runId(), a.call.stepId(), a.call.attempt()));
                settle();
                return;
            }
        }
        throw new IllegalStateException("no call in flight on " + cluster);
    }

    /** The id of the newest run on {@code cluster}. */
    String runOn(String cluster) {
        String id = null;
        for (RunSnapshot r : orch.engine().runs()) if (r.target().cluster().value().equals(cluster)) id = r.runId();
        if (id == null) throw new IllegalStateException("no run on " + cluster);
        return id;
    }

    HandoverReport report(Instant since, Instant until) {
        return store.read(r -> HandoverReport.from(r, ReportPeriod.of(since, until)));
    }

    private void settle() throws InterruptedException {
        orch.runUntil(() -> true);
    }

    @Override
    public void close() {
        store.close();
    }

    /** Simulated actions answered in virtual time, after their simulated duration. */
    private final class VirtualSimulated implements Executor {
        @Override
        public String kind() {
            return "simulated";
        }

        @Override
        public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
            SimulatedAction a = (SimulatedAction) call.action();
            SimulatedOutcome o = SimulatedOutcome.of(1, call.key(), a);
            answers.add(new Answer(clock.instant().plus(o.duration()), order++, call, () -> done.accept(new Input.ExecutorResult(
                    call.runId(), call.stepId(), call.attempt(), o.success(), o.success() ? "simulated success" : "simulated failure",
                    o.success() ? a.clears() : List.of(), Map.of("simulated_ms", o.duration().toMillis())))));
        }

        @Override
        public boolean canAskAgain(Effect.CallExecutor call) {
            return true;
        }
    }

    private record Answer(Instant due, long order, Effect.CallExecutor call, Runnable delivery) {
        void deliver() {
            delivery.run();
        }
    }
}
