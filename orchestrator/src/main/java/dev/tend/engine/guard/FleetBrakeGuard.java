package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import dev.tend.engine.BrakeState;
import dev.tend.shared.time.InstantText;

import java.util.Optional;

/** Holds every automatic start while the fleet brake is engaged. */
public final class FleetBrakeGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.FLEET_BRAKE;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        BrakeState b = ctx.brake();
        if (!b.engaged()) return Optional.empty();
        return Optional.of(Objection.on(code(), Wake.FLEET, "the fleet brake is engaged since "
                + (b.since() == null ? "null" : InstantText.of(b.since()))
                + " by " + b.by() + ": " + b.reason()));
    }
}
