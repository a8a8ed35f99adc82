package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.playbooks.MaskRule;
import dev.tend.playbooks.Scope;
import dev.tend.shared.Id;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.NodeSpec;

import java.util.Optional;

/** Denies a candidate while another active signal explains its problem (the playbook's unless rules): automation must not fight what the cluster's owner caused. */
public final class MaskedGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.MASKED;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        for (MaskRule rule : c.playbook().unless()) {
            Id cluster = c.target().cluster();
            if (rule.on() == Scope.CLUSTER) {
                if (ctx.health().isActive(cluster, null, rule.signal())) {
                    return Optional.of(masked(rule.signal() + " is active on cluster " + cluster));
                }
            } else if (c.target().node() != null) {
                if (ctx.health().isActive(cluster, c.target().node(), rule.signal())) {
                    return Optional.of(masked(rule.signal() + " is active on " + c.target()));
                }
            } else {
                ClusterSpec spec = ctx.health().clusterSpec(cluster);
                if (spec == null) continue;
                for (NodeSpec n : spec.nodes()) {
                    if (ctx.health().isActive(cluster, n.id(), rule.signal())) {
                        return Optional.of(masked(rule.signal() + " is active on " + cluster + "/" + n.id()));
                    }
                }
            }
        }
        return Optional.empty();
    }

    private Objection masked(String why) {
        return Objection.on(code(), Wake.CLUSTER, why + ", which explains this problem; automation leaves it to the owner");
    }
}
