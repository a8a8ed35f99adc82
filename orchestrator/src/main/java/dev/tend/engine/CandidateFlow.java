package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.engine.guard.Decision;
import dev.tend.engine.guard.GuardChain;
import dev.tend.engine.guard.Wake;
import dev.tend.engine.run.RunMachine;
import dev.tend.engine.run.RunProcess;
import dev.tend.playbooks.Mode;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.TendException;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.LinkedHashSet;
import java.util.List;

/**
 * Candidates on their way to a run: the queue of candidates to look at again before the
 * current input is done, their evaluation through the guard chain, and what each verdict
 * leads to (start, ask for approval, hold, drop). Part of the {@link Engine}; not thread-safe.
 */
final class CandidateFlow {
    private static final Comparator<Candidates.Entry> OLDEST_PROBLEM_FIRST = Comparator
            .comparing((Candidates.Entry e) -> e.candidate().problemSince())
            .thenComparing(Candidates.Entry::name);

    private final EngineSetup setup;
    private final EngineContext ctx;
    private final Candidates candidates;
    private final Approvals approvals;
    private final Escalations escalations;
    private final RunMachine machine;
    private final ApprovalHost host;
    private final GuardChain guards = GuardChain.standard();
    private final LinkedHashSet<String> work = new LinkedHashSet<>();

    CandidateFlow(EngineSetup setup, EngineContext ctx, Candidates candidates, Approvals approvals, Escalations escalations,
                  RunMachine machine, ApprovalHost host) {
        this.setup = setup;
        this.ctx = ctx;
        this.candidates = candidates;
        this.approvals = approvals;
        this.escalations = escalations;
        this.machine = machine;
        this.host = host;
    }

    /** Looks at the candidate {@code key} again before the input is done. */
    void queue(Candidate.Key key) {
        work.add(candidates.name(key));
    }

    /** Looks at the candidates named (as {@link Candidate.Key#toString()}) again before the input is done. */
    void queue(Collection<String> names) {
        if (!names.isEmpty()) work.addAll(names);
    }

    /** True when no candidate waits to be looked at: the state between inputs. */
    boolean isSettled() {
        return work.isEmpty();
    }

    /**
     * Evaluates every queued candidate, oldest problem first (DESIGN.md section 4: held
     * candidates that become startable together start in the order their problems began);
     * evaluations may queue more, until none is left.
     */
    void drain(Effects fx) {
        if (work.isEmpty()) return; // the state between most inputs: no list made for nothing
        int guard = 0;
        List<Candidates.Entry> batch = new ArrayList<>();
        while (!work.isEmpty()) {
            batch.clear();
            for (String name : work) {
                Candidate.Key key = candidates.byName(name);
                if (key != null) batch.add(candidates.get(key));
            }
            work.clear();
            if (batch.size() > 1) batch.sort(OLDEST_PROBLEM_FIRST);
            for (Candidates.Entry e : batch) {
                if (candidates.get(e.candidate().key()) != null) evaluate(e.candidate().key(), fx);
                if (++guard > 1_000_000) throw new TendException("the engine did not settle after a million evaluations; this is a bug");
            }
        }
    }

    private void evaluate(Candidate.Key key, Effects fx) {
        Candidates.Entry e = candidates.get(key);
        Candidate c = e.candidate();
        if (!ctx.health.isActive(c.trigger().cluster(), c.trigger().node(), c.trigger().signal())) {
            dev.tend.shared.Id signal = c.trigger().signal();
            drop(key, () -> signal + " is no longer active", fx);
            return;
        }
        Decision d = guards.evaluate(c, ctx);
        if (e.decision() != null && isMaskedOrExcluded(e.decision()) && !isMaskedOrExcluded(d)) {
            // the last mask or exclusion just lifted: confirmation starts again (DESIGN.md section 4)
            c = c.withLiftedAt(ctx.eventTime);
            candidates.put(c, e.decision());
            d = guards.evaluate(c, ctx);
        }
        boolean changed = e.decision() == null || e.decision().verdict() != d.verdict()
                || !e.decision().reasons().equals(d.reasons());
        if (changed) ledgerVerdict(c, d, fx);
        escalations.evaluated(c, d);
        switch (d.verdict()) {
            case START -> start(c, fx);
            case AWAIT_APPROVAL -> {
                Candidate withRun = c.runId() == null ? c.withRun(approvals.request(c, d, fx)) : c;
                candidates.put(withRun, d);
            }
            default -> hold(c, d, fx);
        }
    }

    private static boolean isMaskedOrExcluded(Decision d) {
        return d.has(ReasonCode.MASKED) || d.has(ReasonCode.EXCLUDED);
    }

    private void hold(Candidate c, Decision d, Effects fx) {
        String name = candidates.put(c, d);
        Instant retry = d.retryAt();
        Instant et = d.retryAtEventTime();
        if (et != null && setup.eventTime().follows()) {
            Instant p = setup.eventTime().processingTimeFor(et);
            retry = retry == null || p.isAfter(retry) ? p : retry;
        }
        if (retry != null && d.wakesOn(Wake.TIME) || retry != null && et != null) {
            fx.arm(new TimerKey.Recheck(name), retry);
        }
        escalations.held(c, d, fx);
        if (c.runId() != null) approvals.onHeldOrDenied(c, d, fx);
    }

    private void start(Candidate c, Effects fx) {
        candidates.remove(c.key());
        escalations.started(c);
        ctx.consumePermits(c.playbook());
        ctx.recordStart(c.key());
        RunProcess r = c.runId() != null ? host.run(c.runId())
                : host.newRun(c, RunState.RUNNING, ApprovalHost.AUTOMATION);
        if (c.playbook().mode() == Mode.SHADOW) {
            fx.ledger(LedgerKind.RUN_SHADOWED, "run", r.id(), "playbook", c.playbook().id(), "cluster", c.target().cluster(),
                    "node", c.target().node(), "steps", c.playbook().steps().stream().map(s -> s.id().value()).toList());
            machine.finish(r, RunState.SHADOWED, "shadow mode: decided and recorded, not executed", fx);
            return;
        }
        ctx.active.put(r.id(), r);
        machine.start(r, fx);
    }

    /** Forgets the candidate {@code key} (its problem went away), withdrawing its approval request if any. */
    void drop(Candidate.Key key, java.util.function.Supplier<String> reason, Effects fx) {
        Candidates.Entry e = candidates.get(key);
        if (e == null) return;
        candidates.remove(key);
        fx.cancel(new TimerKey.Recheck(e.name()));
        // the reason's text only when someone reads it (a replay ledgers no dropped candidate)
        if (e.decision() != null && fx.keeps(LedgerKind.CANDIDATE_DROPPED)) {
            fx.ledger(LedgerKind.CANDIDATE_DROPPED, "playbook", key.playbook(), "cluster", key.target().cluster(),
                    "node", key.target().node(), "reason", reason.get(), "run", e.candidate().runId());
        }
        if (e.candidate().runId() != null) approvals.withdraw(e.candidate().runId(), reason.get(), fx);
    }

    private void ledgerVerdict(Candidate c, Decision d, Effects fx) {
        List<String> messages = new ArrayList<>();
        d.objections().forEach(o -> messages.add(o.code().code() + ": " + o.message()));
        fx.ledger(LedgerKind.VERDICT, "playbook", c.playbook().id(), "cluster", c.target().cluster(), "node", c.target().node(),
                "verdict", d.verdict().wireName(), "reasons", d.reasonCodes(), "messages", messages,
                "hold_until", d.retryAt(), "hold_until_event_time", d.retryAtEventTime(),
                "signal", c.trigger().signal(), "problem_since", c.problemSince(), "run", c.runId());
    }
}
