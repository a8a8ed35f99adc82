package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;

import java.util.Optional;

/** Asks a person when the playbook's approval policy covers the cluster; the guards are checked again when the approval arrives. */
public final class ApprovalGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.APPROVAL_REQUIRED;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        if (c.approved() || c.playbook().approval() == null) return Optional.empty();
        var spec = ctx.health().topology().cluster(c.target().cluster());
        var tags = spec.map(s -> s.tags()).orElse(java.util.Map.of());
        if (!c.playbook().approval().clusters().matches(tags)) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.HUMAN, "policy asks a person to approve " + c.playbook().id()
                + " on " + c.target()));
    }
}
