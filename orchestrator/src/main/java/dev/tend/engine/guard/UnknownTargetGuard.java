package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.engine.UnknownTargets;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;

import java.util.Optional;

/**
 * Denies a candidate whose cluster or node (or the node its trigger came from) is not in the
 * topology (the fleet file plus {@code joined}/{@code left} topology events): a typo, a
 * retired node or a hostile caller is shown and ledgered, never remediated. Looked at again
 * when a topology event arrives for the cluster.
 */
public final class UnknownTargetGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.UNKNOWN_TARGET;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        Target t = c.target();
        SignalKey trigger = c.trigger();
        // the usual case, answered from the trigger's slot: the target is the trigger's node or its cluster, and that is known
        if (t.cluster().equals(trigger.cluster()) && (t.node() == null || t.node().equals(trigger.node()))
                && ctx.health().isInTopology(trigger)) {
            return Optional.empty();
        }
        Optional<String> why = UnknownTargets.describe(ctx.health().topology(), c.target());
        if (why.isEmpty() && c.target().node() == null && c.trigger().node() != null) {
            why = UnknownTargets.describe(ctx.health().topology(), c.trigger().cluster(), c.trigger().node());
        }
        return why.map(w -> Objection.on(code(), Wake.CLUSTER, w
                + "; it is shown and ledgered, never remediated (add it to the fleet file or send a 'joined' topology event)"));
    }
}
