package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;

import java.util.Optional;

/** Holds when the playbook's or the fleet's start budget is spent, until a permit frees. */
public final class RateLimitGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.RATE_LIMIT;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        GuardContext.RateCheck r = ctx.rateCheck(c.playbook());
        if (r.available()) return Optional.empty();
        return Optional.of(Objection.until(code(), r.nextPermit(), "the " + r.budget() + " start budget is spent; next permit at "
                + r.nextPermit()));
    }
}
