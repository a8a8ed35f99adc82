package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.shared.time.Durations;
import java.time.Instant;
import java.util.List;

import java.util.Optional;

/** Denies and escalates when the same target was remediated too many times in the loop window; only a person lets automation act on it again. */
public final class LoopGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.LOOP;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        if (ctx.isLoopStopped(c.playbook().id(), c.target())) {
            return Optional.of(Objection.on(code(), Wake.HUMAN, "automation on " + c.target() + " by " + c.playbook().id()
                    + " was stopped as a loop; a person must clear it"));
        }
        EffectiveLimits l = ctx.limits(c.playbook());
        List<Instant> starts = ctx.startsOf(c.playbook().id(), c.target());
        Instant from = ctx.now().minus(l.loop().period());
        long recent = 0;
        for (int i = 0; i < starts.size(); i++) if (starts.get(i).isAfter(from)) recent++;
        if (recent < l.loop().count()) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.HUMAN, c.playbook().id() + " already ran " + recent + " times on "
                + c.target() + " in " + Durations.format(l.loop().period()) + " (limit " + l.loop().count()
                + "); stopping and escalating"));
    }
}
