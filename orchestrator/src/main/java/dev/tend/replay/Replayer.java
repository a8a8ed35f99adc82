package dev.tend.replay;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.playbooks.MaskRule;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import dev.tend.shared.SignalKey;
import dev.tend.shared.TendException;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.Verdict;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.fleet.SignalNumbering;
import dev.tend.shared.time.TimeLimits;
import dev.tend.shared.time.VirtualClock;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.shared.wire.RecordingHeader;
import dev.tend.simulator.FleetModel;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.PlaybookRef;
import dev.tend.simulator.report.RecordingInfo;
import dev.tend.simulator.report.ReplayInfo;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.RunEntry;
import dev.tend.simulator.report.Summary;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.FutureTask;

/**
 * Replays a recording through the production engine in virtual time (DESIGN.md section 7)
 * and reports what would have happened. The engine is the one {@code tend ingest} runs; only
 * its surroundings are simulated: a {@link VirtualClock} instead of the wall clock (event
 * time follows it, lag zero), the {@link Agenda} instead of Quartz, {@link SimulatedFleet}
 * instead of executors, and the {@link FleetModel}'s counterfactual masks over the recording.
 *
 * <p>The recording is fed in file order. Before each event, every timer and executor answer
 * due at or before the event's time is handled, in time order ({@link Agenda} documents the
 * order of ties), each at its own due time (or at the clock's, for one armed in the past). The clock never goes backwards: an event older
 * than the clock is fed at the clock's time, and the engine's fleet view orders it by its
 * own {@code at}. An answer that clears signals on its target is followed by a clear
 * transition per signal at the answer's time, as the live driver does; a signal the
 * recording still shows as a problem there is masked from then on. After the last event
 * virtual time runs on to the header's {@code until}, or two hours past the last event, so
 * that runs finish. No approval arrives in a replay: requests lapse as their expiry says.
 *
 * <p>One replay at a time per instance; each {@link #replay} builds a fresh engine, so the
 * same recording and seed give an equal report.
 */
public final class Replayer {
    /** How long virtual time runs past the last event of a recording without {@code until}. */
    public static final Duration RUN_ON = Duration.ofHours(2);

    private final PlaybookSet policy;
    private final Fleet fleet;
    private final long seed;

    private Replayer(PlaybookSet policy, Fleet fleet, long seed) {
        this.policy = Objects.requireNonNull(policy, "policy");
        this.fleet = Objects.requireNonNull(fleet, "fleet");
        this.seed = seed;
    }

    /** A replayer of {@code policy} (playbooks, actions and tend.yaml) on {@code fleet}, simulated outcomes seeded by {@code seed}. */
    public static Replayer of(PlaybookSet policy, Fleet fleet, long seed) {
        return new Replayer(policy, fleet, seed);
    }

    /** The engine setup a replay runs: the policy's brake, event time following the virtual clock. */
    public EngineSetup setup() {
        return new EngineSetup(policy, policy.config(), fleet, BrakeThresholds.from(policy.config().brake()),
                EventTimeMode.following(Duration.ZERO));
    }

    public ReplayReport replay(Recording recording) {
        return replay(recording, ReplayListener.SILENT);
    }

    /**
     * Replays {@code recording}; bad lines are handed to the listener and skipped.
     *
     * @throws dev.tend.shared.InvalidInputException when the recording cannot be read
     */
    public ReplayReport replay(Recording recording, ReplayListener listener) {
        return replay(recording, listener, ReadAhead.start(recording.withDeclaredSignals(policy.config().signals()), knownIds(), 1), 0);
    }

    /**
     * Replays {@code recording} with this replayer and with {@code other} at once, the other on a
     * thread of its own (each with its own engine: the reports are those of {@link #replay} one
     * after the other). When both policies declare the same signals, the file is read and parsed
     * once for both. Bad lines are handed to the listener as this replay meets them; the other's
     * go only into its report. Returns this replay's report, then the other's.
     */
    public List<ReplayReport> replayWith(Replayer other, Recording recording, ReplayListener listener) {
        FutureTask<ReplayReport> theirs;
        ReadAhead.Reading shared = null;
        if (policy.config().signals().equals(other.policy.config().signals())) {
            List<Id> known = knownIds();
            known.addAll(other.knownIds());
            ReadAhead.Reading reading = ReadAhead.start(recording.withDeclaredSignals(policy.config().signals()), known, 2);
            shared = reading;
            theirs = new FutureTask<>(() -> other.replay(recording, ReplayListener.SILENT, reading, 1));
        } else {
            theirs = new FutureTask<>(() -> other.replay(recording));
        }
        Thread thread = new Thread(theirs, "tend-replay-against");
        thread.setDaemon(true);
        thread.start();
        ReplayReport mine = shared != null ? replay(recording, listener, shared, 0) : replay(recording, listener);
        try {
            return List.of(mine, theirs.get());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new TendException("the second replay of " + recording.file() + " was interrupted", e);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) throw r;
            if (e.getCause() instanceof Error r) throw r;
            throw new TendException("the second replay of " + recording.file() + " failed: " + e.getCause(), e.getCause());
        }
    }

    private ReplayReport replay(Recording recording, ReplayListener listener, ReadAhead.Reading reading, int consumer) {
        Run run = new Run(recording, listener);
        ReadSummary read = reading.take(consumer, run);
        listener.done();
        Instant horizon = run.finish();
        return run.report(read, horizon);
    }

    /** The ids of the fleet's clusters and nodes and of the signals the playbooks and actions name. */
    private List<Id> knownIds() {
        List<Id> ids = new ArrayList<>();
        for (ClusterSpec c : fleet.clusters()) {
            ids.add(c.id());
            for (NodeSpec n : c.nodes()) ids.add(n.id());
        }
        for (Playbook p : policy.playbooks()) {
            ids.add(p.trigger().signal());
            for (MaskRule m : p.unless()) ids.add(m.signal());
            for (Step s : p.allSteps()) if (s instanceof WaitHealthyStep w) ids.addAll(w.signals());
        }
        for (Id a : policy.actions().ids()) {
            if (policy.actions().get(a).orElse(null) instanceof SimulatedAction s) ids.addAll(s.clears());
        }
        return ids;
    }

    /** The state of one replay. */
    private final class Run implements ReadAhead.NumberedSink {
        private final Recording recording;
        private final ReplayListener listener;
        private final RecordingHeader header;
        private final Engine engine = new Engine(setup(), ReportCollector.LEDGER_READ);
        private final Agenda agenda = new Agenda();
        private final SimulatedFleet responses = new SimulatedFleet(seed);
        private final FleetModel model = new FleetModel();
        private final ReportCollector collector = new ReportCollector();
        private VirtualClock clock;
        private Instant lastEventAt;
        private long events;

        private final List<Problem> problems = new ArrayList<>();
        private long unkeepable;

        Run(Recording recording, ReplayListener listener) {
            this.recording = recording;
            this.listener = listener;
            this.header = recording.header().orElse(null);
        }

        @Override
        public void event(WireEvent event, long line) {
            event(event, line, null);
        }

        @Override
        public void event(WireEvent event, long line, SignalNumbering.Numbered key) {
            events++;
            Instant at = event.at();
            if (!TimeLimits.isKeepable(at)) {
                // the live store would refuse it: so does its rehearsal, by line
                unkeepable++;
                problem(Problem.at(recording.file().toString(), (int) Math.min(line, Integer.MAX_VALUE), 0, "at",
                        "field 'at': " + TimeLimits.outside(at) + "; the line is skipped"));
                return;
            }
            if (clock == null) startAt(header != null && header.from() != null && header.from().isBefore(at) ? header.from() : at);
            runDue(at);
            advanceTo(at);
            if (lastEventAt == null || at.isAfter(lastEventAt)) lastEventAt = at;
            if (event instanceof HealthTransition t) {
                if (model.admits(t)) feed(new Input.Transition(t, null, key));
            } else {
                feed(new Input.Topology((TopologyEvent) event));
            }
        }

        @Override
        public void problem(Problem problem) {
            problems.add(problem);
            listener.problem(problem);
        }

        @Override
        public void progress(long bytesRead) {
            listener.progress(bytesRead, recording.size(), events);
        }

        /** Moves the clock forward (it never goes back); most events are at or before the time it shows. */
        private void advanceTo(Instant t) {
            if (t.isAfter(clock.instant())) clock.advanceTo(t);
        }

        private void startAt(Instant t) {
            clock = VirtualClock.at(t);
            collector.start(t);
        }

        /** Runs virtual time on to the horizon; returns it. */
        Instant finish() {
            if (clock == null) {
                if (header == null || header.from() == null) return null;
                startAt(header.from());
            }
            Instant horizon = header != null && header.until() != null ? header.until()
                    : lastEventAt != null ? lastEventAt.plus(RUN_ON) : clock.instant().plus(RUN_ON);
            if (horizon.isBefore(clock.instant())) horizon = clock.instant();
            runDue(horizon);
            clock.advanceTo(horizon);
            return horizon;
        }

        private void runDue(Instant t) {
            Agenda.Item item;
            long guard = 0;
            while ((item = agenda.next(t)) != null) {
                if (++guard > 10_000_000) {
                    throw new TendException("the replay did not settle before " + t + ": over ten million timers and answers"
                            + " due at once; this is a bug in the engine or the replay");
                }
                advanceTo(item.due());
                if (item.isTimer()) {
                    feed(new Input.TimerFired(item.timerKey()));
                } else {
                    answer(item.answer());
                }
            }
        }

        private void answer(Agenda.Answer a) {
            feed(a.result());
            Instant now = clock.instant();
            for (Id signal : a.clears()) {
                SignalKey key = new SignalKey(a.target().cluster(), a.target().node(), signal);
                if (engine.health().isActive(key.cluster(), key.node(), signal)) model.mask(key, now, a.result().runId(), a.action());
                // the simulated fleet reports the signals the action cleared, as a health pipeline would (and as the live driver does)
                feed(Input.Transition.simulatedClear(now, a.target(), signal));
            }
        }

        private void feed(Input in) {
            Instant now = clock.instant();
            List<Effect> effects = engine.handle(in, now);
            collector.observe(effects, now);
            for (int i = 0; i < effects.size(); i++) {
                Effect e = effects.get(i);
                if (e instanceof Effect.ArmTimer a) agenda.arm(a.key(), a.due());
                else if (e instanceof Effect.CancelTimer c) agenda.cancel(c.key());
                else if (e instanceof Effect.CallExecutor call) responses.answer(call, now, agenda);
            }
            collector.afterInput(now, engine.activeRuns(), engine.health().unhealthyClusterCount());
        }

        ReplayReport report(ReadSummary read, Instant horizon) {
            List<RunEntry> runs = ReportCollector.runs(engine.runs());
            long started = 0, succeeded = 0, failed = 0, unfinished = 0, stoodDown = 0;
            for (RunEntry r : runs) {
                if (r.outcome().equals("shadowed")) continue;
                started++;
                if (r.outcome().equals("succeeded")) succeeded++;
                else if (r.outcome().equals("failed")) failed++;
                else if (r.outcome().equals("stood-down")) stoodDown++;
                else if (r.endedAt() == null) unfinished++;
            }
            long held = 0, denied = 0;
            for (DecisionEntry d : collector.decisions()) {
                if (d.verdict() == Verdict.HOLD) held++;
                else if (d.verdict() == Verdict.DENY) denied++;
            }
            Summary summary = new Summary(started, succeeded, failed, held, denied, collector.approvalsRequested(),
                    collector.maxConcurrent(), !collector.brakePeriods().isEmpty(), unfinished, model.hiddenEvents(), stoodDown);
            Instant from = collector.startTime();
            RecordingInfo info = new RecordingInfo(recording.name(), header == null ? null : header.description(), from,
                    header == null ? null : header.until(), horizon, read.events() - unkeepable, read.bad() + unkeepable, engine.health().lateEvents(), problems);
            List<PlaybookRef> playbooks = new ArrayList<>();
            for (Playbook p : policy.playbooks()) playbooks.add(new PlaybookRef(p.id().value(), p.version(), p.contentHash()));
            Duration interval = horizon == null ? Duration.ofMinutes(1) : collector.healthInterval(horizon);
            ReplayInfo replay = new ReplayInfo(seed, playbooks, policy.actions().contentHash(), fleet.name(), fleet.size(), interval);
            return new ReplayReport(info, replay, summary, runs, collector.decisions(), collector.brakePeriods(),
                    collector.notifications(), model.masks(), horizon == null ? List.of() : collector.unhealthy(horizon),
                    assumptions(summary));
        }

        private List<String> assumptions(Summary s) {
            List<String> out = new ArrayList<>(responses.assumptions());
            if (s.approvalsRequested() > 0) {
                out.add("no approval arrives in a replay: each of the " + s.approvalsRequested() + " approval requests lapsed at"
                        + " its expiry or was withdrawn when its problem cleared first");
            }
            if (s.runsUnfinished() > 0) {
                out.add(s.runsUnfinished() + " runs had not ended when virtual time stopped at the horizon");
            }
            return out;
        }
    }
}
