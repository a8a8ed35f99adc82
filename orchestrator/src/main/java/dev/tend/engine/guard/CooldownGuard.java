package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import java.time.Instant;
import java.util.List;
import dev.tend.shared.time.Durations;

import java.util.Optional;

/** Holds when this playbook remediated the same target less than its cooldown ago. */
public final class CooldownGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.COOLDOWN;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        List<Instant> starts = ctx.startsOf(c.playbook().id(), c.target());
        if (starts.isEmpty()) return Optional.empty();
        Instant last = starts.get(starts.size() - 1);
        Instant free = last.plus(ctx.limits(c.playbook()).cooldown());
        if (!ctx.now().isBefore(free)) return Optional.empty();
        return Optional.of(Objection.until(code(), free, c.playbook().id() + " last ran on " + c.target() + " at " + last
                + "; cooldown " + Durations.format(ctx.limits(c.playbook()).cooldown()) + " ends at " + free));
    }
}
