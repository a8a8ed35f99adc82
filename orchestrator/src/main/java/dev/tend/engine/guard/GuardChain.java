package dev.tend.engine.guard;

import dev.tend.engine.Candidate;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The guards in their fixed, documented order (DESIGN.md section 4): unknown-target, excluded, masked,
 * unconfirmed, flapping, fleet-brake, window-closed, cooldown, loop, cluster-busy,
 * blast-radius, quorum, replication, rate-limit, approval-required. Every guard runs, so a
 * verdict lists every reason that applies, not only the first.
 */
public final class GuardChain {
    private final List<Guard> guards;

    private GuardChain(List<Guard> guards) {
        this.guards = List.copyOf(guards);
    }

    public static GuardChain standard() {
        return new GuardChain(List.of(
                new UnknownTargetGuard(), new ExcludedGuard(), new MaskedGuard(), new UnconfirmedGuard(), new FlappingGuard(),
                new FleetBrakeGuard(), new WindowGuard(), new CooldownGuard(), new LoopGuard(),
                new ClusterBusyGuard(), new BlastRadiusGuard(), new QuorumGuard(), new ReplicationGuard(),
                new RateLimitGuard(), new ApprovalGuard()));
    }

    public List<Guard> guards() {
        return guards;
    }

    public Decision evaluate(Candidate candidate, GuardContext context) {
        List<Objection> objections = new ArrayList<>(4);
        for (int i = 0; i < guards.size(); i++) {
            Optional<Objection> o = guards.get(i).check(candidate, context);
            if (o.isPresent()) objections.add(o.get());
        }
        return Decision.of(objections);
    }
}
