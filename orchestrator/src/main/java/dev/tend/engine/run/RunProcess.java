package dev.tend.engine.run;

import dev.tend.engine.RunSnapshot;
import dev.tend.shared.RunState;
import dev.tend.engine.StepSnapshot;
import dev.tend.shared.StepState;
import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.Step;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/**
 * A run's mutable state inside the engine: which step it is on, which attempt, and the
 * record of every step so far. Only the engine's thread touches it; the outside world sees
 * {@link #snapshot()}.
 */
public final class RunProcess {
    final String id;
    final Playbook playbook;
    final Target target;
    /** The signal whose problem the run remedies: the gate checks it still holds. */
    final SignalKey trigger;
    final boolean shadow;
    final Instant createdAt;
    final String requestedBy;
    RunState state;
    Instant startedAt;
    Instant endedAt;
    String outcome;
    /** Index into the main steps, into on-stand-down steps once {@link #standDown} is set, or into on-failure steps once {@link #failing}. */
    int index = -1;
    boolean failing;
    /** Why the gate stood the run down, or null while it has not. */
    StandDown standDown;
    String failedStep;
    int attempt;
    Instant stepStartedAt;
    final List<StepSnapshot> record = new ArrayList<>();

    public RunProcess(String id, Playbook playbook, Target target, SignalKey trigger, boolean shadow, Instant createdAt,
                      String requestedBy, RunState state) {
        this.id = id;
        this.playbook = playbook;
        this.target = target;
        this.trigger = trigger;
        this.shadow = shadow;
        this.createdAt = createdAt;
        this.requestedBy = requestedBy;
        this.state = state;
    }

    public String id() {
        return id;
    }

    public Playbook playbook() {
        return playbook;
    }

    public Target target() {
        return target;
    }

    public SignalKey trigger() {
        return trigger;
    }

    /** Why the gate stood the run down, or null while it has not. */
    public StandDown standDown() {
        return standDown;
    }

    public RunState state() {
        return state;
    }

    public String requestedBy() {
        return requestedBy;
    }

    public Instant startedAt() {
        return startedAt;
    }

    /** The step being executed, or null between steps. */
    public Step currentStep() {
        List<Step> list = steps();
        return index >= 0 && index < list.size() ? list.get(index) : null;
    }

    /** The list of steps being worked through: on-failure, on-stand-down, or the main steps. */
    List<Step> steps() {
        return failing ? playbook.onFailure() : standDown != null ? playbook.onStandDown() : playbook.steps();
    }

    public int attempt() {
        return attempt;
    }

    /** True while the current step is an action call whose result has not come back. */
    public boolean isCalling() {
        return state == RunState.RUNNING && currentStep() instanceof ActionStep && attempt > 0
                && lastRecordIs(StepState.RUNNING);
    }

    /** True when the latest step record is in {@code state}. */
    boolean lastRecordIs(StepState state) {
        return !record.isEmpty() && record.get(record.size() - 1).state() == state;
    }

    void recordStep(StepState stepState, String outcome, Instant at) {
        Step s = currentStep();
        String kind = s.kind();
        StepSnapshot snap = new StepSnapshot(s.id().value(), record.size() + 1, kind, stepState, attempt,
                stepStartedAt, stepState == StepState.RUNNING ? null : at, outcome);
        if (!record.isEmpty() && record.get(record.size() - 1).stepId().equals(snap.stepId())
                && lastRecordIs(StepState.RUNNING)) {
            snap = new StepSnapshot(snap.stepId(), record.size(), kind, stepState, attempt, stepStartedAt,
                    snap.endedAt(), outcome);
            record.set(record.size() - 1, snap);
        } else {
            record.add(snap);
        }
    }

    /** This run as plain values, for an engine snapshot. */
    public RunMemo memo() {
        return new RunMemo(id, playbook.id().value(), playbook.version(), target, trigger, shadow, createdAt, requestedBy, state,
                startedAt, endedAt, outcome, index, failing, standDown, failedStep, attempt, stepStartedAt, record);
    }

    /** The run of {@code m}, on {@code playbook} (the one {@code m} names, at its version). */
    public static RunProcess fromMemo(RunMemo m, Playbook playbook) {
        RunProcess r = new RunProcess(m.id(), playbook, m.target(), m.trigger(), m.shadow(), m.createdAt(), m.requestedBy(), m.state());
        r.startedAt = m.startedAt();
        r.endedAt = m.endedAt();
        r.outcome = m.outcome();
        r.index = m.index();
        r.failing = m.failing();
        r.standDown = m.standDown();
        r.failedStep = m.failedStep();
        r.attempt = m.attempt();
        r.stepStartedAt = m.stepStartedAt();
        r.record.addAll(m.steps());
        return r;
    }

    public RunSnapshot snapshot() {
        Step s = currentStep();
        return new RunSnapshot(id, playbook.id().value(), playbook.version(), target, state, shadow, createdAt,
                startedAt, endedAt, outcome, s == null ? null : s.id().value(), record);
    }
}
