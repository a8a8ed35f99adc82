package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Replication;

import java.util.Optional;

/**
 * Holds when some piece of data could fall below {@code min-healthy} healthy copies: with
 * {@code factor} copies of which at least {@code min-healthy} must stay healthy, at most
 * {@code factor - min-healthy} copies may be impaired at once. Without knowing where the
 * copies are placed, the worst case is assumed: any {@code factor} nodes may hold copies of
 * the same piece.
 */
public final class ReplicationGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.REPLICATION;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        if (!ctx.limits(c.playbook()).keepReplicas()) return Optional.empty();
        ClusterSpec spec = ctx.health().clusterSpec(c.target().cluster());
        if (spec == null || spec.replication() == null) return Optional.empty();
        Replication r = spec.replication();
        int impaired = Impairment.ifStarted(c, ctx);
        if (impaired <= r.tolerableImpaired()) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.CLUSTER, impaired + " nodes of " + spec.id()
                + " would be impaired; with " + r.factor() + " copies of each piece of data, of which " + r.minHealthy()
                + " must stay healthy, at most " + r.tolerableImpaired() + " may be impaired at once"));
    }
}
