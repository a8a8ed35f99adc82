package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;

import java.util.Optional;

/** Holds while the cluster already has as many active runs as the playbook's per-cluster limit. */
public final class ClusterBusyGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.CLUSTER_BUSY;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        int active = ctx.activeRunsOnCluster(c.target().cluster());
        int limit = ctx.limits(c.playbook()).perCluster();
        if (active < limit) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.CLUSTER, active + " run(s) active on " + c.target().cluster()
                + " (limit " + limit + ")"));
    }
}
