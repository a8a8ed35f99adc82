package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.engine.guard.Decision;
import dev.tend.engine.run.RunMachine;
import dev.tend.engine.run.RunProcess;
import dev.tend.shared.ApprovalState;
import dev.tend.shared.Verdict;
import dev.tend.shared.time.InstantText;

import java.time.Instant;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * The approval flow: requests with an expiry, the two-person rule (whoever requested a run
 * cannot approve it), and every guard checked again when an approval arrives, so an approval
 * never overrides the brake, an exclusion or a quorum hold. The other operator commands are
 * {@link OperatorCommands}'. It reaches the engine around it only through {@link ApprovalHost}.
 */
final class Approvals {
    private final ApprovalHost host;
    private final Candidates candidates;
    private final RunMachine machine;
    private final Map<String, ApprovalSnapshot> byRun = new HashMap<>();

    Approvals(ApprovalHost host, Candidates candidates, RunMachine machine) {
        this.host = host;
        this.candidates = candidates;
        this.machine = machine;
    }

    /** Creates the run that waits for a person; returns its id. */
    String request(Candidate c, Decision d, Effects fx) {
        RunProcess r = host.newRun(c, RunState.AWAITING_APPROVAL, ApprovalHost.AUTOMATION);
        Instant expires = fx.now().plus(c.playbook().approval().expiresAfter());
        ApprovalSnapshot a = new ApprovalSnapshot(r.id(), c.playbook().id().value(), c.target(), ApprovalHost.AUTOMATION,
                fx.now(), expires, ApprovalState.PENDING, null, null, d.reasonCodes());
        byRun.put(r.id(), a);
        fx.arm(new TimerKey.ApprovalExpiry(r.id()), expires);
        fx.ledger(LedgerKind.APPROVAL_REQUESTED, "run", r.id(), "playbook", c.playbook().id(), "cluster", c.target().cluster(),
                "node", c.target().node(), "expires_at", expires, "reasons", d.reasonCodes());
        fx.add(new Effect.ApprovalChanged(a));
        fx.add(new Effect.RunChanged(r.snapshot()));
        fx.add(new Effect.Notify(r.id() + "/approval", PageKind.APPROVAL_REQUESTED, host.pageChannel(),
                c.playbook().id() + " on " + c.target() + " waits for an approval until " + expires, pageFields(a)));
        java.time.Duration before = host.approvalReminder();
        Instant remindAt = expires.minus(before);
        if (!before.isZero() && remindAt.isAfter(fx.now())) fx.arm(new TimerKey.ApprovalReminder(r.id()), remindAt);
        return r.id();
    }

    /** The reminder timer fired: pages once more while the approval is still pending. */
    void remind(String runId, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || s.state() != ApprovalState.PENDING) return;
        fx.add(new Effect.Notify(runId + "/approval-lapsing", PageKind.APPROVAL_LAPSING, host.pageChannel(),
                s.playbook() + " on " + s.target() + " still waits for an approval; it lapses at " + InstantText.toSecond(s.expiresAt()), pageFields(s)));
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

    CommandAnswer approve(Input.Approve a, Effects fx) {
        ApprovalSnapshot s = byRun.get(a.runId());
        if (s == null || s.state() != ApprovalState.PENDING) return notPending(a.runId(), s, a.by(), a.from(), fx);
        if (a.by().equals(s.requestedBy())) {
            String why = "two-person rule: whoever requested a run cannot approve it";
            fx.ledger(LedgerKind.APPROVAL_REFUSED, "run", a.runId(), "by", a.by(), "from", a.from(), "reason", why);
            return new CommandAnswer.Refused(CommandAnswer.Refusal.TWO_PERSON_RULE, why);
        }
        return decide(a.runId(), ApprovalState.APPROVED, a.by(), a.from(), null, fx);
    }

    CommandAnswer reject(Input.Reject r, Effects fx) {
        return decide(r.runId(), ApprovalState.REJECTED, r.by(), r.from(), r.reason(), fx);
    }

    /** Refuses to decide an approval that is not pending, on the record. */
    private static CommandAnswer notPending(String runId, ApprovalSnapshot s, String by, String from, Effects fx) {
        fx.ledger(LedgerKind.APPROVAL_REFUSED, "run", runId, "by", by, "from", from, "reason", notPending(s));
        return s == null ? new CommandAnswer.NotFound("no approval was requested for run " + runId)
                : new CommandAnswer.Refused(CommandAnswer.Refusal.NOT_PENDING, notPending(s));
    }

    private CommandAnswer decide(String runId, ApprovalState state, String by, String from, String reason, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || s.state() != ApprovalState.PENDING) return notPending(runId, s, by, from, fx);
        ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                s.expiresAt(), state, by, fx.now(), s.reasons());
        byRun.put(runId, d);
        fx.cancel(new TimerKey.ApprovalExpiry(runId));
        fx.cancel(new TimerKey.ApprovalReminder(runId));
        fx.ledger(state == ApprovalState.APPROVED ? LedgerKind.APPROVAL_GRANTED : LedgerKind.APPROVAL_REJECTED, "run", runId, "playbook", s.playbook(),
                "cluster", s.target().cluster(), "node", s.target().node(), "by", by, "from", from, "reason", reason);
        fx.add(new Effect.ApprovalChanged(d));
        Candidate.Key key = keyOf(s);
        Candidates.Entry e = candidates.get(key);
        if (state == ApprovalState.APPROVED) {
            if (e != null) {
                candidates.put(e.candidate().withApproved(), e.decision());
                host.queue(key);
            }
        } else {
            cancelRun(runId, "rejected by " + by + (reason == null ? "" : ": " + reason), fx);
            if (e != null) candidates.remove(key);
        }
        return CommandAnswer.done();
    }

    /** Why an approval cannot be decided: none was asked, or who decided it and when (approving twice says by whom). */
    private static String notPending(ApprovalSnapshot s) {
        if (s == null) return "no approval was requested for this run";
        String when = s.decidedAt() == null ? "" : " at " + s.decidedAt().truncatedTo(java.time.temporal.ChronoUnit.SECONDS);
        return switch (s.state()) {
            case APPROVED, REJECTED -> "the run was already " + s.state().wireName() + (s.decidedBy() == null ? "" : " by " + s.decidedBy()) + when;
            case LAPSED -> "the approval lapsed" + when + " (it expired at " + InstantText.toSecond(s.expiresAt()) + ")";
            default -> "the approval is " + s.state().wireName() + when;
        };
    }

    void expire(String runId, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || s.state() != ApprovalState.PENDING) return;
        ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                s.expiresAt(), ApprovalState.LAPSED, null, fx.now(), s.reasons());
        byRun.put(runId, d);
        fx.cancel(new TimerKey.ApprovalReminder(runId));
        fx.ledger(LedgerKind.APPROVAL_LAPSED, "run", runId, "playbook", s.playbook(), "cluster", s.target().cluster(),
                "node", s.target().node(), "expired_at", s.expiresAt());
        fx.add(new Effect.ApprovalChanged(d));
        cancelRun(runId, "the approval lapsed at " + InstantText.toSecond(s.expiresAt()), fx);
        candidates.remove(keyOf(s));
    }

    /** The problem went away while a person was asked. */
    void withdraw(String runId, String why, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s != null && s.state() == ApprovalState.PENDING) {
            ApprovalSnapshot d = new ApprovalSnapshot(runId, s.playbook(), s.target(), s.requestedBy(), s.requestedAt(),
                    s.expiresAt(), ApprovalState.WITHDRAWN, null, fx.now(), s.reasons());
            byRun.put(runId, d);
            fx.cancel(new TimerKey.ApprovalExpiry(runId));
            fx.cancel(new TimerKey.ApprovalReminder(runId));
            fx.add(new Effect.ApprovalChanged(d));
        }
        cancelRun(runId, why, fx);
    }

    /** An approved run that guards still hold waits as held; a denied one is cancelled. */
    void onHeldOrDenied(Candidate c, Decision d, Effects fx) {
        RunProcess r = host.run(c.runId());
        if (r == null || r.state().isTerminal()) return;
        if (d.verdict() == Verdict.DENY) {
            cancelRun(r.id(), "denied after approval: " + d.reasonCodes(), fx);
            candidates.remove(c.key());
        } else if (c.approved() && r.state() != RunState.HELD) {
            machine.markHeld(r, fx);
        }
    }

    /** An abort of run {@code runId} while its approval is pending: withdraws the approval (and so cancels the run); false when none is pending. */
    boolean withdrawPending(String runId, String why, Effects fx) {
        ApprovalSnapshot s = byRun.get(runId);
        if (s == null || s.state() != ApprovalState.PENDING) return false;
        withdraw(runId, why, fx);
        candidates.remove(keyOf(s));
        return true;
    }

    private void cancelRun(String runId, String why, Effects fx) {
        RunProcess r = host.run(runId);
        if (r != null && !r.state().isTerminal()) machine.finish(r, RunState.CANCELLED, why, fx);
    }

    private static Candidate.Key keyOf(ApprovalSnapshot s) {
        return new Candidate.Key(dev.tend.shared.Id.of(s.playbook()), s.target());
    }

    /** Puts back an approval of a snapshot, in the order {@link #all()} gave it. */
    void restore(ApprovalSnapshot a) {
        byRun.put(a.runId(), a);
    }

    List<ApprovalSnapshot> all() {
        return List.copyOf(byRun.values());
    }
}
