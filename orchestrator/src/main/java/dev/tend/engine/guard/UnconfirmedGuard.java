package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.shared.ReasonCode;
import java.time.Duration;
import java.time.Instant;
import dev.tend.shared.time.Durations;
import dev.tend.shared.time.InstantText;

import java.util.Optional;

/**
 * Holds until the problem has lasted the playbook's confirm-for, measured in event time from
 * the later of its onset and the moment the last mask or exclusion on it lifted: an owner who
 * just finished a fix gets the whole confirm-for again before automation steps in.
 */
public final class UnconfirmedGuard implements Guard {
    @Override
    public ReasonCode code() {
        return ReasonCode.UNCONFIRMED;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        Duration need = c.playbook().trigger().confirmFor();
        if (need == null || need.isZero()) return Optional.empty();
        Instant since = c.confirmingSince();
        Instant confirmedAt = since.plus(need);
        if (!ctx.eventTime().isBefore(confirmedAt)) return Optional.empty();
        Duration lasted = Duration.between(since, ctx.eventTime());
        String from = since.equals(c.problemSince()) ? "" : " since the last mask or exclusion lifted";
        return Optional.of(Objection.untilEventTime(code(), confirmedAt, c.trigger().signal() + " has lasted "
                + Durations.format(lasted.isNegative() ? Duration.ZERO : lasted) + from + " of the "
                + Durations.format(need) + " it must last; confirmed at " + InstantText.of(confirmedAt) + " if it holds"));
    }
}
