package dev.tend.engine.run;

import dev.tend.engine.Effect;
import dev.tend.engine.Effects;
import dev.tend.engine.LedgerKind;
import dev.tend.engine.PageKind;
import dev.tend.shared.RunState;
import dev.tend.shared.StepState;
import dev.tend.engine.TimerKey;
import dev.tend.playbooks.ActionDef;
import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.Template;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.Id;
import dev.tend.shared.time.Durations;

import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Moves runs through their steps: action (an executor call with a timeout and retries),
 * wait-healthy (continue once the signals clear on the target, within a limit), page;
 * the on-failure steps when a step fails or times out. Before each attempt of an action step
 * the run's gate asks the host whether the run is still needed; if not, the run stands down:
 * its on-stand-down steps run and it ends {@link RunState#STOOD_DOWN}. Pauses at step boundaries while the
 * fleet brake is engaged. Deterministic: timers and calls are effects with stable keys.
 */
public final class RunMachine {
    /** Used when neither the step nor its action names a timeout (lint flags such steps). */
    public static final Duration DEFAULT_TIMEOUT = Duration.ofMinutes(10);

    private final RunHost host;

    public RunMachine(RunHost host) {
        this.host = host;
    }

    static TimerKey stepTimer(RunProcess r) {
        return new TimerKey.StepTimeout(r.id, r.currentStep().id().value(), r.attempt);
    }

    static TimerKey waitTimer(RunProcess r) {
        return new TimerKey.WaitTimeout(r.id, r.currentStep().id().value());
    }

    /** Starts a run that passed its guards. */
    public void start(RunProcess r, Effects fx) {
        r.state = RunState.RUNNING;
        r.startedAt = fx.now();
        fx.ledger(LedgerKind.RUN_STARTED, "run", r.id, "playbook", r.playbook.id(), "version", r.playbook.version(),
                "cluster", r.target.cluster(), "node", r.target.node());
        advance(r, fx);
    }

    /** Moves to the next step, executing pages and already-satisfied waits inline. */
    public void advance(RunProcess r, Effects fx) {
        while (true) {
            if (host.isBrakeEngaged() && !r.failing && r.standDown == null && r.index + 1 < r.playbook.steps().size() && r.index >= 0) {
                r.state = RunState.PAUSED;
                fx.ledger(LedgerKind.RUN_PAUSED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                        "reason", "fleet brake engaged; paused at a step boundary");
                changed(r, fx);
                return;
            }
            List<Step> list = r.steps();
            r.index++;
            r.attempt = 0;
            if (r.index >= list.size()) {
                if (r.failing) finish(r, RunState.FAILED, "failed at " + r.failedStep, fx);
                else if (r.standDown != null) finish(r, RunState.STOOD_DOWN, "stood down (" + r.standDown.reason().code() + "): "
                        + r.standDown.message(), fx);
                else finish(r, RunState.SUCCEEDED, "all steps succeeded", fx);
                return;
            }
            r.stepStartedAt = fx.now();
            Step s = list.get(r.index);
            if (s instanceof PageStep n) {
                String msg = render(n.message(), r);
                // a page of on-stand-down says the run stood down; one of on-failure or the main steps is the playbook's own
                boolean standingDown = r.standDown != null && !r.failing;
                Map<String, Object> fields = pageFields(r);
                if (standingDown) fields.put("stand_down", r.standDown.reason().code());
                fx.add(new Effect.Notify(r.id + "/" + n.id(), standingDown ? PageKind.STOOD_DOWN : PageKind.PLAYBOOK, n.channel().value(),
                        msg, fields));
                r.recordStep(StepState.SUCCEEDED, "notified " + n.channel().value(), fx.now());
                fx.ledger(LedgerKind.STEP_FINISHED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                        "step", n.id(), "state", StepState.SUCCEEDED.wireName(), "channel", n.channel(), "message", msg);
                continue;
            }
            if (s instanceof WaitHealthyStep w) {
                if (host.allClear(r.target, w.signals())) {
                    r.recordStep(StepState.SUCCEEDED, "signals already clear", fx.now());
                    fx.ledger(LedgerKind.STEP_FINISHED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                            "step", w.id(), "state", StepState.SUCCEEDED.wireName(), "outcome", "signals already clear");
                    continue;
                }
                r.recordStep(StepState.RUNNING, null, fx.now());
                fx.arm(waitTimer(r), fx.now().plus(w.within()));
                fx.ledger(LedgerKind.STEP_STARTED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                        "step", w.id(), "step_kind", "wait-healthy", "signals", w.signals(), "within", Durations.format(w.within()));
                changed(r, fx);
                return;
            }
            ActionStep a = (ActionStep) s;
            if (standsDown(a, r, fx)) return;
            call(a, r, fx, 1);
            return;
        }
    }

    /**
     * The gate before an action step of the main steps (each attempt): when the run is no
     * longer needed, it stands down, runs its on-stand-down steps, and true is returned.
     */
    private boolean standsDown(ActionStep a, RunProcess r, Effects fx) {
        if (r.failing || r.standDown != null) return false;
        java.util.Optional<StandDown> why = host.gate(r, a.continueIfCleared());
        if (why.isEmpty()) return false;
        r.standDown = why.get();
        fx.ledger(LedgerKind.RUN_STANDING_DOWN, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "node", r.target.node(), "before_step", a.id(), "reason", why.get().reason().code(), "message", why.get().message(),
                "steps", r.playbook.onStandDown().stream().map(st -> st.id().value()).toList());
        r.index = -1;
        advance(r, fx);
        return true;
    }

    private void call(ActionStep a, RunProcess r, Effects fx, int attempt) {
        r.attempt = attempt;
        r.stepStartedAt = fx.now();
        Effect.CallExecutor c = callOf(r, a, attempt);
        r.recordStep(StepState.RUNNING, null, fx.now());
        fx.ledger(LedgerKind.EXECUTOR_CALL, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "node", r.target.node(), "step", a.id(), "attempt", attempt, "key", c.key(), "action", a.action(),
                "executor", c.action().kind(), "timeout", Durations.format(c.timeout()));
        fx.arm(stepTimer(r), fx.now().plus(c.timeout()));
        fx.add(c);
        changed(r, fx);
    }

    /** The call of attempt {@code attempt} of step {@code a}: its idempotency key, action and timeout, computed here only. */
    private Effect.CallExecutor callOf(RunProcess r, ActionStep a, int attempt) {
        ActionDef def = host.action(a.action());
        Duration timeout = a.timeout() != null ? a.timeout() : def.timeout() != null ? def.timeout() : DEFAULT_TIMEOUT;
        return new Effect.CallExecutor(r.id, a.id().value(), attempt, Effect.CallExecutor.idempotencyKey(r.id, a.id().value(), attempt),
                def, r.target, r.playbook.id().value(), timeout);
    }

    /** The call run {@code r} has out ({@link RunProcess#isCalling()}), as it was made: to settle it after a restart. */
    public Effect.CallExecutor callInFlight(RunProcess r) {
        if (!r.isCalling()) throw new IllegalStateException("run " + r.id + " has no call out");
        return callOf(r, (ActionStep) r.currentStep(), r.attempt);
    }

    /** An executor answered; ignored unless it answers the current attempt. */
    public void onResult(RunProcess r, String stepId, int attempt, boolean success, String message,
                         Map<String, Object> detail, Effects fx) {
        Step s = r.currentStep();
        if (r.state != RunState.RUNNING || !(s instanceof ActionStep a) || !a.id().value().equals(stepId)
                || r.attempt != attempt || !r.lastRecordIs(StepState.RUNNING)) {
            fx.ledger(LedgerKind.EXECUTOR_RESULT_IGNORED, "run", r.id, "step", stepId, "attempt", attempt,
                    "reason", "the run is no longer waiting for this attempt");
            return;
        }
        fx.cancel(stepTimer(r));
        Map<String, Object> fields = new LinkedHashMap<>(detail);
        fx.ledger(LedgerKind.EXECUTOR_RESULT, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "step", stepId, "attempt", attempt, "success", success, "message", message, "detail", fields);
        if (success) {
            r.recordStep(StepState.SUCCEEDED, message, fx.now());
            advance(r, fx);
        } else {
            retryOrFail(a, r, StepState.FAILED, "failed: " + message, fx);
        }
    }

    /** A step or wait timer came due. */
    public void onTimer(RunProcess r, TimerKey key, Effects fx) {
        Step s = r.currentStep();
        if (r.state != RunState.RUNNING || s == null) return;
        if (s instanceof ActionStep a && key.equals(stepTimer(r)) && r.lastRecordIs(StepState.RUNNING)) {
            fx.ledger(LedgerKind.STEP_TIMED_OUT, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                    "step", a.id(), "attempt", r.attempt);
            retryOrFail(a, r, StepState.TIMED_OUT, "timed out", fx);
        } else if (s instanceof WaitHealthyStep w && key.equals(waitTimer(r))) {
            r.recordStep(StepState.TIMED_OUT, "signals still active after " + Durations.format(w.within()), fx.now());
            fail(r, w.id(), fx);
        }
    }

    /** A transition cleared something on the run's target: a waiting step may be done. */
    public void onHealthChange(RunProcess r, Effects fx) {
        if (r.state != RunState.RUNNING || !(r.currentStep() instanceof WaitHealthyStep w)) return;
        if (!host.allClear(r.target, w.signals())) return;
        fx.cancel(waitTimer(r));
        r.recordStep(StepState.SUCCEEDED, "signals cleared", fx.now());
        fx.ledger(LedgerKind.STEP_FINISHED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "step", w.id(), "state", StepState.SUCCEEDED.wireName(), "outcome", "signals cleared");
        advance(r, fx);
    }

    /** The outcome of the in-flight call cannot be learnt: stop and ask a person. */
    public void onOutcomeUnknown(RunProcess r, String stepId, int attempt, Effects fx) {
        if (!r.isCalling() || r.attempt != attempt) return;
        fx.cancel(stepTimer(r));
        r.recordStep(StepState.UNKNOWN, "outcome unknown after a restart", fx.now());
        r.state = RunState.NEEDS_HUMAN;
        fx.ledger(LedgerKind.RUN_NEEDS_HUMAN, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "step", stepId, "attempt", attempt,
                "reason", "the call was in flight when tend stopped and its action cannot be asked again by key");
        fx.add(new Effect.Notify(r.id + "/needs-human", PageKind.NEEDS_HUMAN, host.pageChannel(), "run " + r.id + " on " + r.target
                + " needs a person: the outcome of step " + stepId + " is unknown", pageFields(r)));
        changed(r, fx);
    }

    /** What a page about run {@code r} carries besides its message. */
    static Map<String, Object> pageFields(RunProcess r) {
        Map<String, Object> f = new java.util.LinkedHashMap<>();
        f.put("run", r.id);
        f.put("playbook", r.playbook.id().value());
        f.put("cluster", r.target.cluster().value());
        if (r.target.node() != null) f.put("node", r.target.node().value());
        return f;
    }

    /** Releases a run paused by the brake. */
    public void resume(RunProcess r, Effects fx) {
        if (r.state != RunState.PAUSED) return;
        r.state = RunState.RUNNING;
        fx.ledger(LedgerKind.RUN_RESUMED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster());
        advance(r, fx);
    }

    /** An approved run whose guards still hold it. */
    public void markHeld(RunProcess r, Effects fx) {
        r.state = RunState.HELD;
        changed(r, fx);
    }

    public void abort(RunProcess r, String reason, Effects fx) {
        if (r.state.isTerminal()) return;
        if (r.isCalling()) fx.cancel(stepTimer(r));
        if (r.currentStep() instanceof WaitHealthyStep) fx.cancel(waitTimer(r));
        finish(r, RunState.CANCELLED, reason, fx);
    }

    /** Another attempt while retries are left (this one recorded failed); else the step ends {@code last}. */
    private void retryOrFail(ActionStep a, RunProcess r, StepState last, String why, Effects fx) {
        if (r.attempt <= a.retries()) {
            r.recordStep(StepState.FAILED, why, fx.now());
            if (standsDown(a, r, fx)) return;
            call(a, r, fx, r.attempt + 1);
            return;
        }
        r.recordStep(last, why, fx.now());
        fail(r, a.id(), fx);
    }

    private void fail(RunProcess r, Id step, Effects fx) {
        fx.ledger(LedgerKind.STEP_FAILED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(), "step", step);
        if (r.failing) {
            advance(r, fx);
            return;
        }
        r.failing = true;
        r.failedStep = step.value();
        r.index = -1;
        advance(r, fx);
    }

    public void finish(RunProcess r, RunState end, String outcome, Effects fx) {
        r.state = end;
        r.endedAt = fx.now();
        r.outcome = outcome;
        fx.ledger(LedgerKind.RUN_ENDED, "run", r.id, "playbook", r.playbook.id(), "cluster", r.target.cluster(),
                "node", r.target.node(), "state", end.wireName(), "outcome", outcome,
                "stand_down", end == RunState.STOOD_DOWN ? r.standDown.reason().code() : null);
        changed(r, fx);
        host.runEnded(r, fx);
    }

    private static void changed(RunProcess r, Effects fx) {
        fx.add(new Effect.RunChanged(r.snapshot()));
    }

    static String render(Template template, RunProcess r) {
        Step s = r.currentStep();
        return template.render(Map.of("cluster", r.target.cluster().value(),
                "node", r.target.node() == null ? "-" : r.target.node().value(),
                "run", r.id,
                "playbook", r.playbook.id().value(),
                "step", r.failedStep != null ? r.failedStep : s == null ? "-" : s.id().value()));
    }
}
