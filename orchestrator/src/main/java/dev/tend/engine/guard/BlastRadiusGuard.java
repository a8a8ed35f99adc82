package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.NodeSpec;

import java.util.Optional;

/**
 * Holds when the run would take the cluster's impaired share (unhealthy plus under
 * remediation, counting this run's target) above {@code impaired-fraction}, or would exceed
 * the per-zone or fleet-wide cap on concurrent runs.
 */
public final class BlastRadiusGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.BLAST_RADIUS;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        EffectiveLimits l = ctx.limits(c.playbook());
        int impaired = Impairment.ifStarted(c, ctx);
        int size = Impairment.clusterSize(c, ctx, impaired);
        double share = (double) impaired / size;
        if (share > l.impairedFraction() + 1e-9) {
            return Optional.of(Objection.on(code(), Wake.CLUSTER, impaired + " of " + size + " nodes of " + c.target().cluster()
                    + " would be impaired (" + Fixed.of(share * 100, 0) + "%), above impaired-fraction "
                    + Fixed.of(l.impairedFraction(), 2)));
        }
        int fleet = ctx.activeRunsInFleet();
        if (fleet >= l.fleet()) {
            return Optional.of(Objection.on(code(), Wake.FLEET, fleet + " runs active fleet-wide (cap " + l.fleet() + ")"));
        }
        if (c.target().node() != null) {
            ClusterSpec spec = ctx.health().clusterSpec(c.target().cluster());
            String zone = spec == null ? null : spec.node(c.target().node()).map(NodeSpec::zone).orElse(null);
            if (zone != null) {
                int inZone = ctx.activeRunsInZone(zone);
                if (inZone >= l.perZone()) {
                    return Optional.of(Objection.on(code(), Wake.FLEET, inZone + " runs active in zone " + zone
                            + " (cap " + l.perZone() + ")"));
                }
            }
        }
        return Optional.empty();
    }
}
