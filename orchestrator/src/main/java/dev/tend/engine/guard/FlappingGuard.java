package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.shared.time.Durations;
import java.time.Instant;

import java.util.Optional;

/** Holds a signal that changed state more often than the flapping limit allows in its window (event time). */
public final class FlappingGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.FLAPPING;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        EffectiveLimits l = ctx.limits(c.playbook());
        int changes = ctx.health().changesWithin(c.trigger(), ctx.eventTime(), l.flapping().period());
        if (changes <= l.flapping().changes()) return Optional.empty();
        Instant calm = ctx.eventTime().plus(l.flapping().period());
        return Optional.of(new Objection(code(), c.trigger() + " changed state " + changes + " times in "
                + Durations.format(l.flapping().period()) + " (limit " + l.flapping().changes() + ")",
                Wake.EVENT_TIME, null, calm));
    }
}
