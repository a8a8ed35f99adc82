package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.fleet.ClusterSpec;

import java.util.Optional;

/**
 * Holds when a majority-quorum ensemble would not keep a strict majority of its nodes
 * healthy and untouched: with n nodes, at most floor((n-1)/2) may be impaired at once.
 */
public final class QuorumGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.QUORUM;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        if (!ctx.limits(c.playbook()).keepQuorum()) return Optional.empty();
        ClusterSpec spec = ctx.health().clusterSpec(c.target().cluster());
        if (spec == null || !spec.quorum()) return Optional.empty();
        int n = spec.size();
        int impaired = Impairment.ifStarted(c, ctx);
        int healthy = n - impaired;
        if (2 * healthy > n) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.CLUSTER, "ensemble " + spec.id() + " would keep " + Math.max(healthy, 0)
                + " of " + n + " nodes healthy; a majority needs " + (n / 2 + 1)));
    }
}
