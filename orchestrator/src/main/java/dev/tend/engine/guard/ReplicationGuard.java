package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Replication;

import java.util.Optional;

/**
 * Holds when some partition could fall below its minimum in-sync replicas: with factor RF
 * and minimum m, at most RF - m replicas of one partition may be impaired. Without
 * partition placement, the worst case is assumed: any RF nodes may share a partition.
 */
public final class ReplicationGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.REPLICATION;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        if (!ctx.limits(c.playbook()).keepInSync()) return Optional.empty();
        ClusterSpec spec = ctx.health().topology().cluster(c.target().cluster()).orElse(null);
        if (spec == null || spec.replication() == null) return Optional.empty();
        Replication r = spec.replication();
        int impaired = Impairment.ifStarted(c, ctx);
        if (impaired <= r.tolerableImpaired()) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.CLUSTER, impaired + " nodes of " + spec.id()
                + " would be impaired; with replication factor " + r.factor() + " and min-in-sync " + r.minInSync()
                + " a partition tolerates " + r.tolerableImpaired()));
    }
}
