package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.engine.guard.Decision;
import dev.tend.engine.run.RunHost;
import dev.tend.engine.run.RunMachine;
import dev.tend.engine.run.RunProcess;
import dev.tend.engine.run.StandDown;
import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.Mode;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.Scope;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;
import dev.tend.shared.TendException;
import dev.tend.shared.fleet.ApplyOutcome;
import dev.tend.shared.fleet.FleetHealthView;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;

/**
 * The deterministic decision engine: inputs and their processing time in, effects out, no
 * I/O inside. The same inputs at the same times give the same effects in the same order,
 * which is what makes a replay (and a restart, which replays the journal) trustworthy.
 *
 * <p>Not thread-safe: one thread feeds it, in journal order.
 */
public final class Engine implements RunHost {
    /** Who automation's own requests are made by (for the two-person rule). */
    public static final String AUTOMATION = ApprovalHost.AUTOMATION;

    // package-private for EngineSnapshots, which takes and restores them
    private final EngineSetup setup;
    final EngineContext ctx;
    private final RunMachine machine = new RunMachine(this);
    final Candidates candidates = new Candidates();
    final Approvals approvals;
    private final OperatorCommands commands;
    final Escalations escalations;
    final CandidateFlow flow;
    final Map<String, RunProcess> runs = new LinkedHashMap<>();
    final Map<String, Instant> timers = new TreeMap<>();
    long runSeq;
    long inputs;
    /** The ledger kinds this engine's effects carry; null for every kind. */
    private final Set<LedgerKind> ledgered;

    public Engine(EngineSetup setup) {
        this(setup, new FleetHealthView(setup.fleet()), null);
    }

    /**
     * An engine that decides exactly as {@link #Engine(EngineSetup)} does, but whose effects carry
     * ledger entries of the kinds {@code ledgered} only: for a caller that keeps no ledger and reads
     * a few kinds (a replay reads verdicts and approval requests), so that the entries of every
     * other kind are not built for nothing. No decision reads a ledger entry.
     */
    public Engine(EngineSetup setup, Set<LedgerKind> ledgered) {
        this(setup, new FleetHealthView(setup.fleet()), java.util.Objects.requireNonNull(ledgered, "ledgered"));
    }

    Engine(EngineSetup setup, FleetHealthView view) {
        this(setup, view, null);
    }

    private Engine(EngineSetup setup, FleetHealthView view, Set<LedgerKind> ledgered) {
        if (ledgered != null) {
            Set<LedgerKind> kinds = java.util.EnumSet.noneOf(LedgerKind.class);
            kinds.addAll(ledgered);
            this.ledgered = kinds;
        } else {
            this.ledgered = null;
        }
        this.setup = setup;
        this.ctx = new EngineContext(view, setup.config(), new FleetBrake(setup.brake(), setup.config().paging().brakeGather()));
        Host host = new Host();
        this.approvals = new Approvals(host, candidates, machine);
        this.commands = new OperatorCommands(ctx, approvals, machine, host);
        this.escalations = new Escalations(ctx);
        this.flow = new CandidateFlow(setup, ctx, candidates, approvals, escalations, machine, host);
    }

    /** Handles one input at processing time {@code now} (never earlier than the last). */
    public List<Effect> handle(Input in, Instant now) {
        if (now.isAfter(ctx.now)) ctx.now = now;
        inputs++;
        Effects fx = new Effects(ctx.now, ledgered);
        if (in instanceof Input.Transition t) onTransition(t, fx);
        else if (in instanceof Input.Topology t) {
            if (ctx.health.apply(t.event()) != ApplyOutcome.LATE) {
                advanceEventTime(t.event().at());
                queueCluster(t.event().cluster());
                fx.ledger(LedgerKind.TOPOLOGY, "cluster", t.event().cluster(), "node", t.event().node(),
                        "change", t.event().change().wireName(), "at_event", t.event().at());
            }
        } else if (in instanceof Input.TimerFired t) onTimer(t.key(), fx);
        else if (in instanceof Input.ExecutorResult r) onResult(r, fx);
        else if (in instanceof Input.OutcomeUnknown u) {
            RunProcess r = runs.get(u.runId());
            if (r != null) machine.onOutcomeUnknown(r, u.stepId(), u.attempt(), fx);
        } else if (in instanceof Input.Command c) commands.handle(c, fx);
        // Tick: nothing but the clocks below
        if (setup.eventTime().follows()) advanceEventTime(ctx.now.minus(setup.eventTime().lag()));
        flow.drain(fx);
        track(fx.list());
        return fx.list();
    }

    private void onTransition(Input.Transition in, Effects fx) {
        HealthTransition t = in.transition();
        // one key instance for the whole input: the health view remembers the last slot it found by it
        SignalKey signal = in.key();
        ApplyOutcome outcome = in.numbered() != null ? ctx.health.apply(t, in.numbered()) : ctx.health.apply(t);
        if (outcome != ApplyOutcome.LATE) advanceEventTime(t.at());
        if (!outcome.isStateChange()) return;
        boolean released = ctx.brake.reconsider(ctx.health, fx);
        if (released) onBrakeReleased(fx);
        queueCluster(t.cluster());
        boolean mattered = false;
        if (outcome == ApplyOutcome.CLEARED) {
            for (Candidate.Key k : candidates.triggeredBy(signal)) {
                flow.drop(k, () -> t.signal() + " cleared on " + k.target(), fx);
                mattered = true;
            }
            // the active runs on the cluster, as they stand before any of them is told (telling one may end it)
            List<RunProcess> onCluster = null;
            for (RunProcess r : ctx.active.values()) {
                if (r.target().cluster().equals(t.cluster())) {
                    if (onCluster == null) onCluster = new ArrayList<>(2);
                    onCluster.add(r);
                }
            }
            if (onCluster != null) {
                for (RunProcess r : onCluster) machine.onHealthChange(r, fx);
                mattered = true;
            }
        } else {
            dev.tend.shared.fleet.ClusterSpec spec = ctx.health.clusterSpec(t.cluster());
            Map<String, String> tags = spec != null ? spec.tags() : Map.of();
            for (Playbook p : setup.playbooks().match(t, tags)) {
                Target target = p.trigger().scope() == Scope.NODE ? Target.node(t.cluster(), t.node()) : Target.cluster(t.cluster());
                Candidate.Key key = new Candidate.Key(p.id(), target);
                mattered = true;
                if (hasLiveRun(key) || candidates.get(key) != null) continue;
                Instant since = ctx.health.status(signal).map(s -> s.since()).orElse(t.at());
                candidates.put(new Candidate(p, target, signal, since, ctx.now, null, false, null), null);
                flow.queue(key);
            }
        }
        boolean unknown = !ctx.health.isInTopology(signal);
        if ((mattered || unknown) && fx.keeps(LedgerKind.TRANSITION)) {
            fx.ledger(LedgerKind.TRANSITION, "cluster", t.cluster(), "node", t.node(), "signal", t.signal(),
                    "state", t.state().wireName(), "at_event", t.at(), "unknown_target", unknown ? Boolean.TRUE : null);
        }
    }

    private boolean hasLiveRun(Candidate.Key key) {
        for (RunProcess r : ctx.active.values()) {
            if (r.playbook().id().equals(key.playbook()) && r.target().equals(key.target())) return true;
        }
        return false;
    }

    private void onTimer(String wire, Effects fx) {
        timers.remove(wire);
        TimerKey key = TimerKey.parse(wire).orElse(null);
        if (key instanceof TimerKey.Recheck k) {
            flow.queue(candidates.dueByTime(ctx.now));
            flow.queue(List.of(k.candidate()));
        } else if (key instanceof TimerKey.BrakePage) {
            ctx.brake.pageDue(fx);
        } else if (key instanceof TimerKey.ApprovalReminder k) {
            approvals.remind(k.run(), fx);
        } else if (key instanceof TimerKey.BrakeSettle) {
            if (ctx.brake.settled(ctx.health, fx)) onBrakeReleased(fx);
        } else if (key instanceof TimerKey.ApprovalExpiry k) {
            approvals.expire(k.run(), fx);
        } else if (key instanceof TimerKey.StepTimeout k) {
            RunProcess r = runs.get(k.run());
            if (r != null) machine.onTimer(r, k, fx);
        } else if (key instanceof TimerKey.WaitTimeout k) {
            RunProcess r = runs.get(k.run());
            if (r != null) machine.onTimer(r, k, fx);
        }
    }

    private void onResult(Input.ExecutorResult res, Effects fx) {
        RunProcess r = runs.get(res.runId());
        if (r == null) {
            fx.ledger(LedgerKind.EXECUTOR_RESULT_IGNORED, "run", res.runId(), "reason", "no such run");
            return;
        }
        machine.onResult(r, res.stepId(), res.attempt(), res.success(), res.message(), res.detail(), fx);
    }

    private void advanceEventTime(Instant t) {
        if (!t.isAfter(ctx.eventTime)) return;
        ctx.eventTime = t;
        flow.queue(candidates.dueByEventTime(t));
    }

    private void queueCluster(Id cluster) {
        flow.queue(candidates.onCluster(cluster));
    }

    private void queueFleet() {
        flow.queue(candidates.fleetWide());
    }

    private void queue(Candidate.Key key) {
        flow.queue(key);
    }

    private RunProcess newRun(Candidate c, RunState state, String requestedBy) {
        String id = String.format("r%06d", ++runSeq);
        Playbook p = c.playbook();
        RunProcess r = new RunProcess(id, p, c.target(), c.trigger(), p.mode() == Mode.SHADOW, ctx.now, requestedBy, state);
        runs.put(id, r);
        return r;
    }

    private void onBrakeReleased(Effects fx) {
        queueFleet();
        for (RunProcess r : new ArrayList<>(ctx.active.values())) machine.resume(r, fx);
    }

    private void track(List<Effect> effects) {
        for (int i = 0; i < effects.size(); i++) {
            Effect e = effects.get(i);
            if (e instanceof Effect.ArmTimer a) timers.put(a.key(), a.due());
            else if (e instanceof Effect.CancelTimer c) timers.remove(c.key());
        }
    }

    // ---- RunHost ----

    @Override
    public ActionDef action(Id id) {
        return setup.playbooks().actions().get(id)
                .orElseThrow(() -> new TendException("action " + id + " is not defined; the playbook set was validated, so this is a bug"));
    }

    @Override
    public String pageChannel() {
        return ctx.config.paging().channel().value();
    }

    @Override
    public boolean isBrakeEngaged() {
        return ctx.brake.state().engaged();
    }

    @Override
    public Optional<StandDown> gate(RunProcess r, boolean ignoreCleared) {
        return RunGate.check(r, ctx, ignoreCleared);
    }

    @Override
    public boolean allClear(Target target, List<Id> signals) {
        for (Id s : signals) {
            if (target.node() != null) {
                if (ctx.health.isActive(target.cluster(), target.node(), s)) return false;
            } else if (ctx.health.isActive(target.cluster(), null, s)) {
                return false;
            }
        }
        return true;
    }

    @Override
    public void runEnded(RunProcess r, Effects fx) {
        ctx.active.remove(r.id());
        StandDown sd = r.standDown();
        if (r.state() == RunState.STOOD_DOWN && sd.reason() != StandDown.Reason.CLEARED && r.trigger() != null) {
            // the problem is still there, only hands-off for now: wait (denied) for the mask or exclusion to lift,
            // and then for confirm-for again
            Candidate.Key key = new Candidate.Key(r.playbook().id(), r.target());
            var status = ctx.health.status(r.trigger());
            if (status.isPresent() && status.get().isProblem() && candidates.get(key) == null) {
                candidates.put(new Candidate(r.playbook(), r.target(), r.trigger(), status.get().since(), ctx.now, null, false, null), null);
                queue(key);
            }
        }
        queueCluster(r.target().cluster());
        queueFleet();
    }

    /** What the approval flow and the operator commands reach of the engine: narrow, and not the engine itself. */
    private final class Host implements ApprovalHost, CommandHost {
        @Override public RunProcess newRun(Candidate c, RunState state, String requestedBy) { return Engine.this.newRun(c, state, requestedBy); }
        @Override public RunProcess run(String id) { return runs.get(id); }
        @Override public void queue(Candidate.Key key) { Engine.this.queue(key); }
        @Override public void queueCluster(Id cluster) { Engine.this.queueCluster(cluster); }
        @Override public void brakeReleased(Effects fx) { onBrakeReleased(fx); }
        @Override public String pageChannel() { return Engine.this.pageChannel(); }
        @Override public java.time.Duration approvalReminder() { return ctx.config.paging().approvalReminder(); }
    }

    // ---- snapshots ----

    /**
     * The engine's whole state as plain values (see {@link EngineState}); call it between
     * inputs. Together with the same {@link EngineSetup}, {@link #restore} rebuilds an engine
     * that answers the next inputs exactly as this one would.
     */
    public EngineState state() {
        return EngineSnapshots.take(this);
    }

    /**
     * An engine in the state {@code s}, taken by {@link #state()} from an engine built on the
     * same setup. Throws {@link TendException} when {@code s} names a playbook that the setup
     * lacks, or a run that the state lacks.
     */
    public static Engine restore(EngineSetup setup, EngineState s) {
        return EngineSnapshots.restore(setup, s);
    }

    // ---- queries ----

    public FleetHealthView health() {
        return ctx.health;
    }

    public BrakeState brake() {
        return ctx.brake.state();
    }

    public Instant eventTime() {
        return ctx.eventTime;
    }

    public long inputsHandled() {
        return inputs;
    }

    public Collection<RunSnapshot> runs() {
        List<RunSnapshot> out = new ArrayList<>();
        for (RunProcess r : runs.values()) out.add(r.snapshot());
        return out;
    }

    public Optional<RunSnapshot> run(String id) {
        return Optional.ofNullable(runs.get(id)).map(RunProcess::snapshot);
    }

    public int activeRuns() {
        return ctx.active.size();
    }

    /** True while some run is executing steps (not paused, not waiting for a person). */
    public boolean isExecuting() {
        for (RunProcess r : ctx.active.values()) if (r.state() == RunState.RUNNING) return true;
        return false;
    }

    /** Timers the engine has armed and not seen fire or cancelled: re-armed after a restart. */
    public Map<String, Instant> armedTimers() {
        return Map.copyOf(timers);
    }

    /** Candidates waiting (held, denied, awaiting approval) with their last verdict. */
    public List<HeldCandidate> heldCandidates() {
        List<HeldCandidate> out = new ArrayList<>();
        for (Candidates.Entry e : candidates.all()) {
            if (e.decision() != null) out.add(new HeldCandidate(e.candidate(), e.decision()));
        }
        return out;
    }

    public record HeldCandidate(Candidate candidate, Decision decision) {
    }

    /** Executor calls whose result has not arrived: asked again by key, or stopped, after a restart. */
    public List<Effect.CallExecutor> inFlightCalls() {
        List<Effect.CallExecutor> out = new ArrayList<>();
        for (RunProcess r : ctx.active.values()) {
            if (r.isCalling()) out.add(machine.callInFlight(r));
        }
        return out;
    }
}
