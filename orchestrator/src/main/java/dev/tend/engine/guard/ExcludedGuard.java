package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.engine.Exclusion;

import java.util.Optional;

/** Denies a target on the exclusion list; looked at again when the exclusion lapses or is removed. */
public final class ExcludedGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.EXCLUDED;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        Optional<Exclusion> ex = ctx.exclusionOf(c.target());
        if (ex.isEmpty()) return Optional.empty();
        Exclusion e = ex.get();
        String msg = e.target() + " is excluded by " + e.by() + " (" + e.reason() + ", owner " + e.owner()
                + (e.until() == null ? ", until removed)" : ", until " + e.until() + ")");
        return Optional.of(e.until() == null
                ? Objection.on(code(), Wake.HUMAN, msg)
                : new Objection(code(), msg, Wake.TIME, e.until(), null));
    }
}
