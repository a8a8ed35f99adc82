package dev.tend.engine;

import dev.tend.engine.run.RunMachine;
import dev.tend.engine.run.RunProcess;
import dev.tend.shared.ReasonCode;

import java.util.Optional;

/**
 * Every operator command ({@link Input.Command}), each answered with a {@link CommandAnswer}
 * (added to the effects as {@link Effect.Answered}, exactly one per command): approvals go to
 * the approval flow ({@link Approvals}); exclusions, the brake, clearing a loop and aborting a
 * run are carried out here. It reaches the engine around it only through {@link CommandHost}.
 */
final class OperatorCommands {
    private final EngineContext ctx;
    private final Approvals approvals;
    private final RunMachine machine;
    private final CommandHost host;

    OperatorCommands(EngineContext ctx, Approvals approvals, RunMachine machine, CommandHost host) {
        this.ctx = ctx;
        this.approvals = approvals;
        this.machine = machine;
        this.host = host;
    }

    void handle(Input.Command cmd, Effects fx) {
        CommandAnswer answer;
        if (cmd instanceof Input.Approve a) answer = approvals.approve(a, fx);
        else if (cmd instanceof Input.Reject r) answer = approvals.reject(r, fx);
        else if (cmd instanceof Input.AbortRun a) answer = abort(a, fx);
        else if (cmd instanceof Input.Exclude e) answer = exclude(e, fx);
        else if (cmd instanceof Input.Unexclude u) answer = unexclude(u, fx);
        else if (cmd instanceof Input.EngageBrake b) {
            fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", b.kind(), "by", b.by(), "from", b.from());
            ctx.brake.engage(b.by(), b.reason(), fx);
            answer = CommandAnswer.done();
        } else if (cmd instanceof Input.ReleaseBrake b) answer = release(b, fx);
        else if (cmd instanceof Input.ClearLoop l) answer = clearLoop(l, fx);
        else throw new IllegalStateException("an operator command the engine does not know: " + cmd.kind());
        fx.add(new Effect.Answered(cmd.kind(), answer));
    }

    private CommandAnswer exclude(Input.Exclude e, Effects fx) {
        Optional<String> unknown = UnknownTargets.describe(ctx.health.topology(), e.target());
        if (unknown.isPresent()) {
            String why = unknown.get() + "; only a cluster or node in the topology can be excluded";
            fx.ledger(LedgerKind.COMMAND_REFUSED, "command", e.kind(), "cluster", e.target().cluster(), "node", e.target().node(),
                    "by", e.by(), "from", e.from(), "code", ReasonCode.UNKNOWN_TARGET.code(), "reason", why);
            boolean clusterKnown = ctx.health.topology().cluster(e.target().cluster()).isPresent();
            return new CommandAnswer.Refused(clusterKnown ? CommandAnswer.Refusal.UNKNOWN_NODE : CommandAnswer.Refusal.UNKNOWN_CLUSTER, why);
        }
        Exclusion ex;
        try {
            ex = new Exclusion(e.target(), e.reason(), e.owner(), fx.now(), e.until(), e.by());
        } catch (IllegalArgumentException | NullPointerException bad) {
            // a command that cannot be carried out is refused on the record, never thrown at the driver
            fx.ledger(LedgerKind.COMMAND_REFUSED, "command", e.kind(), "cluster", e.target().cluster(), "node", e.target().node(),
                    "by", e.by(), "from", e.from(), "reason", bad.getMessage());
            return new CommandAnswer.Refused(CommandAnswer.Refusal.INVALID, String.valueOf(bad.getMessage()));
        }
        ctx.exclusions.put(e.target(), ex);
        fx.ledger(LedgerKind.EXCLUSION_ADDED, "cluster", e.target().cluster(), "node", e.target().node(), "reason", e.reason(),
                "owner", e.owner(), "until", e.until(), "by", e.by(), "from", e.from());
        fx.add(new Effect.ExclusionsChanged(e.target(), ex));
        host.queueCluster(e.target().cluster());
        return CommandAnswer.done();
    }

    private CommandAnswer unexclude(Input.Unexclude u, Effects fx) {
        Exclusion gone = ctx.exclusions.remove(u.target());
        fx.ledger(LedgerKind.EXCLUSION_REMOVED, "cluster", u.target().cluster(), "node", u.target().node(),
                "by", u.by(), "from", u.from(), "existed", gone != null);
        fx.add(new Effect.ExclusionsChanged(u.target(), null));
        host.queueCluster(u.target().cluster());
        return gone == null ? new CommandAnswer.NotFound(u.target() + " is not excluded") : CommandAnswer.done();
    }

    private CommandAnswer release(Input.ReleaseBrake b, Effects fx) {
        fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", b.kind(), "by", b.by(), "from", b.from());
        if (!ctx.brake.releaseByHand(b.by(), b.reason(), ctx.health, fx)) {
            return new CommandAnswer.Refused(CommandAnswer.Refusal.NOT_ENGAGED, "the fleet brake is not engaged; nothing was released");
        }
        host.brakeReleased(fx);
        return CommandAnswer.done();
    }

    private CommandAnswer clearLoop(Input.ClearLoop l, Effects fx) {
        Candidate.Key key = new Candidate.Key(l.playbook(), l.target());
        boolean was = ctx.loopStopped.remove(key);
        ctx.starts.remove(key);
        fx.ledger(LedgerKind.LOOP_CLEARED, "playbook", l.playbook(), "cluster", l.target().cluster(), "node", l.target().node(),
                "by", l.by(), "from", l.from(), "was_stopped", was);
        host.queue(key);
        return CommandAnswer.done();
    }

    private CommandAnswer abort(Input.AbortRun a, Effects fx) {
        RunProcess r = host.run(a.runId());
        fx.ledger(LedgerKind.OPERATOR_COMMAND, "command", a.kind(), "run", a.runId(), "by", a.by(), "from", a.from(), "reason", a.reason());
        if (r == null) return new CommandAnswer.NotFound("no run " + a.runId());
        if (r.state().isTerminal()) {
            return new CommandAnswer.Refused(CommandAnswer.Refusal.ENDED, "run " + r.id() + " already ended: " + r.state().wireName());
        }
        if (approvals.withdrawPending(r.id(), "aborted by " + a.by(), fx)) return CommandAnswer.done();
        machine.abort(r, "aborted by " + a.by() + (a.reason() == null ? "" : ": " + a.reason()), fx);
        return CommandAnswer.done();
    }
}
