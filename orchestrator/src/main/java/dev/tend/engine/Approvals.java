package dev.tend.engine;

import dev.tend.shared.ReasonCode;

import dev.tend.engine.guard.Decision;
import dev.tend.engine.run.RunProcess;
import dev.tend.shared.Verdict;

import java.time.Instant;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Operator commands and the approval flow: requests with an expiry, the two-person rule
 * (whoever requested a run cannot approve it), and every guard checked again when an
 * approval arrives, so an approval never overrides the brake, an exclusion or a quorum hold.
 */
final class Approvals {
    private final Engine engine;
    static final String REMINDER_TIMER = "approval-reminder:";
    private final Map<String, ApprovalSnapshot> byRun = new HashMap<>();

    Approvals(Engine engine) {
        this.engine = engine;
    }

    /** Creates the run that waits for a person; returns its id. */
    String request(Candidate c, Decision d, Effects fx) {
        RunProcess r = engine.newRun(c, RunState.AWAITING_APPROVAL, Engine.AUTOMATION);
        Instant expires = fx.now().plus(c.playbook().approval().expiresAfter());
        ApprovalSnapshot a = new ApprovalSnapshot(r.id(), c.playbook().id().value(), c.target(), Engine.AUTOMATION,
                fx.now(), expires, "pending", null, null, d.reasonCodes());
        byRun.put(r.id(), a);
        fx.arm("approval:" + r.id(), expires);
        fx.ledger(LedgerKind.APPROVAL_REQUESTED, "run", r.id(), "playbook", c.playbook().id(), "cluster", c.target().cluster(),
                "node", c.target().node(), "expires_at", expires, "reasons", d.reasonCodes());
        fx.add(new Effect.ApprovalChanged(a));
        fx.add(new Effect.RunChanged(r.snapshot()));
        fx.add(new Effect.Notify(r.id() + "/approval", PageKind.APPROVAL_REQUESTED, engine.pageChannel(),
                c.playbook().id() + " on " + c.target() + " waits for an approval until " + expires, pageFields(a)));
        java.time.Duration before = engine.paging().approvalReminder();
        Instant remindAt = expires.minus(before);
        if (!before.isZero() && remindAt.isAfter(fx.now())) fx.arm(REMINDER_TIMER + r.id(), remindAt);
        return r.id();
    }

    /** The reminder timer fired: pages once more while the approval is still pending. */
    void remind(String runId, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || !s.state().equals("pending")) return;
        fx.add(new Effect.Notify(runId + "/approval-lapsing", PageKind.APPROVAL_LAPSING, engine.pageChannel(),
                s.playbook() + " on " + s.target() + " still waits for an approval; it lapses at " + s.expiresAt(), pageFields(s)));
    }

    private static Map<String, Object> pageFields(ApprovalSnapshot a) {
        Map<String, Object> f = new java.util.LinkedHashMap<>();
        f.put("run", a.runId());
        f.put("playbook", a.playbook());
        f.put("cluster", a.target().cluster().value());
        if (a.target().node() != null) f.put("node", a.target().node().value());
        f.put("expires_at", Effects.normalise(a.expiresAt()));
        return f;
    }

    void onCommand(Input.Command cmd, Effects fx) {
        if (cmd instanceof Input.Approve a) approve(a, fx);
        else if (cmd instanceof Input.Reject r) decide(r.runId(), "rejected", r.by(), r.from(), r.reason(), fx);
        else if (cmd instanceof Input.AbortRun a) abort(a, fx);
        else if (cmd instanceof Input.Exclude e) {
            java.util.Optional<String> unknown = UnknownTargets.describe(engine.context().health.topology(), e.target());
            if (unknown.isPresent()) {
                fx.ledger(LedgerKind.COMMAND_REFUSED, "command", e.kind(), "cluster", e.target().cluster(), "node", e.target().node(),
                        "by", e.by(), "from", e.from(), "code", ReasonCode.UNKNOWN_TARGET.code(),
                        "reason", unknown.get() + "; only a cluster or node in the topology can be excluded");
                return;
            }
            Exclusion ex;
            try {
                ex = new Exclusion(e.target(), e.reason(), e.owner(), fx.now(), e.until(), e.by());
            } catch (IllegalArgumentException | NullPointerException bad) {
                // a command that cannot be carried out is refused on the record, never thrown at the driver
                fx.ledger(LedgerKind.COMMAND_REFUSED, "command", e.kind(), "cluster", e.target().cluster(), "node", e.target().node(),
                        "by", e.by(), "from", e.from(), "reason", bad.getMessage());
                return;
            }
            engine.context().exclusions.put(e.target(), ex);
            fx.ledger(LedgerKind.EXCLUSION_ADDED, "cluster", e.target().cluster(), "node", e.target().node(), "reason", e.reason(),
                    "owner", e.owner(), "until", e.until(), "by", e.by(), "from", e.from());
            fx.add(new Effect.ExclusionsChanged(e.target(), ex));
            engine.queueCluster(e.target().cluster());
        } else if (cmd instanceof Input.Unexclude u) {
            Exclusion gone = engine.context().exclusions.remove(u.target());
            fx.ledger(LedgerKind.EXCLUSION_REMOVED, "cluster", u.target().cluster(), "node", u.target().node(),
                    "by", u.by(), "from", u.from(), "existed", gone != null);
            fx.add(new Effect.ExclusionsChanged(u.target(), null));
            engine.queueCluster(u.target().cluster());
        } else if (cmd instanceof Input.EngageBrake b) {
            fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", b.kind(), "by", b.by(), "from", b.from());
            engine.context().brake.engage(b.by(), b.reason(), fx);
        } else if (cmd instanceof Input.ReleaseBrake b) {
            fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", b.kind(), "by", b.by(), "from", b.from());
            if (engine.context().brake.releaseByHand(b.by(), b.reason(), engine.context().health, fx)) engine.onBrakeReleased(fx);
        } else if (cmd instanceof Input.ClearLoop l) {
            Candidate.Key key = new Candidate.Key(l.playbook(), l.target());
            boolean was = engine.context().loopStopped.remove(key);
            engine.context().starts.remove(key);
            fx.ledger(LedgerKind.LOOP_CLEARED, "playbook", l.playbook(), "cluster", l.target().cluster(), "node", l.target().node(),
                    "by", l.by(), "from", l.from(), "was_stopped", was);
            engine.queue(key);
        }
    }

    private void approve(Input.Approve a, Effects fx) {
        ApprovalSnapshot s = byRun.get(a.runId());
        if (s == null || !s.state().equals("pending")) {
            fx.ledger(LedgerKind.APPROVAL_REFUSED, "run", a.runId(), "by", a.by(), "from", a.from(),
                    "reason", notPending(s));
            return;
        }
        if (a.by().equals(s.requestedBy())) {
            fx.ledger(LedgerKind.APPROVAL_REFUSED, "run", a.runId(), "by", a.by(), "from", a.from(),
                    "reason", "two-person rule: whoever requested a run cannot approve it");
            return;
        }
        decide(a.runId(), "approved", a.by(), a.from(), null, fx);
    }

    private void decide(String runId, String state, String by, String from, String reason, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || !s.state().equals("pending")) {
            fx.ledger(LedgerKind.APPROVAL_REFUSED, "run", runId, "by", by, "from", from,
                    "reason", notPending(s));
            return;
        }
        ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                s.expiresAt(), state, by, fx.now(), s.reasons());
        byRun.put(runId, d);
        fx.cancel("approval:" + runId);
        fx.cancel(REMINDER_TIMER + runId);
        fx.ledger(state.equals("approved") ? LedgerKind.APPROVAL_GRANTED : LedgerKind.APPROVAL_REJECTED, "run", runId, "playbook", s.playbook(),
                "cluster", s.target().cluster(), "node", s.target().node(), "by", by, "from", from, "reason", reason);
        fx.add(new Effect.ApprovalChanged(d));
        Candidate.Key key = keyOf(s);
        Candidates.Entry e = engine.candidates().get(key);
        if (state.equals("approved")) {
            if (e != null) {
                engine.candidates().put(e.candidate().withApproved(), e.decision());
                engine.queue(key);
            }
        } else {
            cancelRun(runId, "rejected by " + by + (reason == null ? "" : ": " + reason), fx);
            if (e != null) engine.candidates().remove(key);
        }
    }

    /** Why an approval cannot be decided: none was asked, or who decided it and when (approving twice says by whom). */
    private static String notPending(ApprovalSnapshot s) {
        if (s == null) return "no approval was requested for this run";
        String when = s.decidedAt() == null ? "" : " at " + s.decidedAt().truncatedTo(java.time.temporal.ChronoUnit.SECONDS);
        return switch (s.state()) {
            case "approved", "rejected" -> "the run was already " + s.state() + (s.decidedBy() == null ? "" : " by " + s.decidedBy()) + when;
            case "lapsed" -> "the approval lapsed" + when + " (it expired at " + s.expiresAt().truncatedTo(java.time.temporal.ChronoUnit.SECONDS) + ")";
            default -> "the approval is " + s.state() + when;
        };
    }

    void expire(String runId, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || !s.state().equals("pending")) return;
        ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                s.expiresAt(), "lapsed", null, fx.now(), s.reasons());
        byRun.put(runId, d);
        fx.cancel(REMINDER_TIMER + runId);
        fx.ledger(LedgerKind.APPROVAL_LAPSED, "run", runId, "playbook", s.playbook(), "cluster", s.target().cluster(),
                "node", s.target().node(), "expired_at", s.expiresAt());
        fx.add(new Effect.ApprovalChanged(d));
        cancelRun(runId, "the approval lapsed at " + s.expiresAt(), fx);
        engine.candidates().remove(keyOf(s));
    }

    /** The problem went away while a person was asked. */
    void withdraw(String runId, String why, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s != null && s.state().equals("pending")) {
            ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                    s.expiresAt(), "withdrawn", null, fx.now(), s.reasons());
            byRun.put(runId, d);
            fx.cancel("approval:" + runId);
            fx.cancel(REMINDER_TIMER + runId);
            fx.add(new Effect.ApprovalChanged(d));
        }
        cancelRun(runId, why, fx);
    }

    /** An approved run that guards still hold waits as held; a denied one is cancelled. */
    void onHeldOrDenied(Candidate c, Decision d, Effects fx) {
        RunProcess r = engine.runById(c.runId());
        if (r == null || r.state().isTerminal()) return;
        if (d.verdict() == Verdict.DENY) {
            cancelRun(r.id(), "denied after approval: " + d.reasonCodes(), fx);
            engine.candidates().remove(c.key());
        } else if (c.approved() && r.state() != RunState.HELD) {
            engine.machine().markHeld(r, fx);
        }
    }

    private void abort(Input.AbortRun a, Effects fx) {
        RunProcess r = engine.runById(a.runId());
        fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", "abort", "run", a.runId(), "by", a.by(), "from", a.from(), "reason", a.reason());
        if (r == null || r.state().isTerminal()) return;
        ApprovalSnapshot s = byRun.get(r.id());
        if (s != null && s.state().equals("pending")) {
            withdraw(r.id(), "aborted by " + a.by(), fx);
            engine.candidates().remove(keyOf(s));
            return;
        }
        engine.machine().abort(r, "aborted by " + a.by() + (a.reason() == null ? "" : ": " + a.reason()), fx);
    }

    private void cancelRun(String runId, String why, Effects fx) {
        RunProcess r = engine.runById(runId);
        if (r != null && !r.state().isTerminal()) engine.machine().finish(r, RunState.CANCELLED, why, fx);
    }

    private static Candidate.Key keyOf(ApprovalSnapshot s) {
        return new Candidate.Key(dev.tend.shared.Id.of(s.playbook()), s.target());
    }

    List<ApprovalSnapshot> all() {
        return List.copyOf(byRun.values());
    }
}
