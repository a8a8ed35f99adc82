package dev.tend.engine;

import dev.tend.engine.run.RunMemo;
import dev.tend.engine.run.RunProcess;
import dev.tend.playbooks.Playbook;
import dev.tend.shared.Id;
import dev.tend.shared.TendException;
import dev.tend.shared.fleet.FleetHealthView;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * An {@link Engine}'s whole state as plain values ({@link EngineState}) and back: what a
 * snapshot stores, so that a restart reads the snapshot and the journal after it instead of
 * replaying the whole journal.
 */
final class EngineSnapshots {
    private EngineSnapshots() {
    }

    /** The state of {@code e}, taken between inputs. */
    static EngineState take(Engine e) {
        if (!e.flow.isSettled()) throw new IllegalStateException("the engine's state is taken between inputs only");
        EngineContext ctx = e.ctx;
        List<EngineState.Timer> armed = new ArrayList<>(e.timers.size());
        e.timers.forEach((k, due) -> armed.add(new EngineState.Timer(k, due)));
        List<RunMemo> runMemos = new ArrayList<>(e.runs.size());
        for (RunProcess r : e.runs.values()) runMemos.add(r.memo());
        List<EngineState.CandidateMemo> cands = new ArrayList<>();
        for (Candidates.Entry en : e.candidates.all()) {
            Candidate c = en.candidate();
            cands.add(new EngineState.CandidateMemo(c.playbook().id().value(), c.target(), c.trigger(), c.problemSince(),
                    c.firstSeen(), c.runId(), c.approved(), c.liftedAt(), en.decision()));
        }
        List<EngineState.Starts> starts = new ArrayList<>();
        ctx.starts.forEach((k, at) -> starts.add(new EngineState.Starts(k, at)));
        starts.sort(Comparator.comparing(st -> st.key().toString()));
        List<Candidate.Key> loops = new ArrayList<>(ctx.loopStopped);
        loops.sort(Comparator.comparing(Candidate.Key::toString));
        List<ApprovalSnapshot> asked = new ArrayList<>(e.approvals.all());
        asked.sort(Comparator.comparing(ApprovalSnapshot::runId));
        return new EngineState(ctx.now, ctx.eventTime, e.inputs, e.runSeq, armed, runMemos, List.copyOf(ctx.active.keySet()), cands,
                e.candidates.eventAgenda(), e.candidates.timeAgenda(), starts, loops, e.escalations.flapPaged(),
                List.copyOf(ctx.exclusions.values()), ctx.brake.memo(), ctx.budgets.memo(), asked, ctx.health.memo());
    }

    /** An engine on {@code setup} in the state {@code s}; see {@link Engine#restore}. */
    static Engine restore(EngineSetup setup, EngineState s) {
        Engine e = new Engine(setup, FleetHealthView.restore(setup.fleet(), s.health()));
        EngineContext ctx = e.ctx;
        ctx.now = s.now();
        ctx.eventTime = s.eventTime();
        e.inputs = s.inputs();
        e.runSeq = s.runSeq();
        for (EngineState.Timer t : s.timers()) e.timers.put(t.key(), t.due());
        for (RunMemo m : s.runs()) {
            e.runs.put(m.id(), RunProcess.fromMemo(m, playbook(setup, m.playbook())));
        }
        for (String id : s.activeRuns()) {
            RunProcess r = e.runs.get(id);
            if (r == null) throw new TendException("the snapshot lists run " + id + " as active but holds no such run");
            ctx.active.put(id, r);
        }
        for (EngineState.CandidateMemo c : s.candidates()) {
            Playbook p = playbook(setup, c.playbook());
            e.candidates.put(new Candidate(p, c.target(), c.trigger(), c.problemSince(), c.firstSeen(), c.runId(), c.approved(), c.liftedAt()),
                    c.decision());
        }
        e.candidates.restoreAgendas(s.eventAgenda(), s.timeAgenda());
        for (EngineState.Starts st : s.starts()) ctx.starts.put(st.key(), new ArrayList<>(st.at()));
        ctx.loopStopped.addAll(s.loopStopped());
        e.escalations.restoreFlapPaged(s.flapPaged());
        for (Exclusion x : s.exclusions()) ctx.exclusions.put(x.target(), x);
        ctx.brake.restore(s.brake());
        ctx.budgets.restore(s.budgets());
        for (ApprovalSnapshot a : s.approvals()) e.approvals.restore(a);
        return e;
    }

    /**
     * The setup's playbook {@code id}. A run keeps going on the version loaded now, as it
     * would after a full replay of the journal with this setup.
     */
    private static Playbook playbook(EngineSetup setup, String id) {
        return setup.playbooks().playbook(Id.of(id)).orElseThrow(() -> new TendException("the snapshot holds runs or "
                + "candidates of playbook " + id + ", which is not loaded now; load it again to start from this snapshot"));
    }
}
