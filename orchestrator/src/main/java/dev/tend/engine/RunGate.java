package dev.tend.engine;

import dev.tend.engine.guard.ExcludedGuard;
import dev.tend.engine.guard.MaskedGuard;
import dev.tend.engine.run.RunProcess;
import dev.tend.engine.run.StandDown;
import dev.tend.shared.SignalKey;

import java.util.Optional;

/**
 * The gate inside a run (DESIGN.md section 4): before every action step the run must still
 * be needed. Checked in this order, the first that applies is the reason: an exclusion now
 * covers the target ({@code excluded}), a mask of the playbook now applies ({@code masked}),
 * the trigger is no longer in breach or silent ({@code cleared}, unless the step is written
 * {@code if-cleared: continue}). The exclusion and mask checks are the guards' own, so a gate
 * and a verdict never disagree about what a mask or an exclusion is.
 */
final class RunGate {
    private static final ExcludedGuard EXCLUDED = new ExcludedGuard();
    private static final MaskedGuard MASKED = new MaskedGuard();

    private RunGate() {
    }

    static Optional<StandDown> check(RunProcess r, EngineContext ctx, boolean ignoreCleared) {
        Candidate c = new Candidate(r.playbook(), r.target(), r.trigger(), ctx.now, ctx.now, r.id(), true, null);
        var excluded = EXCLUDED.check(c, ctx);
        if (excluded.isPresent()) return Optional.of(new StandDown(StandDown.Reason.EXCLUDED, excluded.get().message()));
        var masked = MASKED.check(c, ctx);
        if (masked.isPresent()) return Optional.of(new StandDown(StandDown.Reason.MASKED, masked.get().message()));
        SignalKey t = r.trigger();
        if (!ignoreCleared && !ctx.health.isActive(t.cluster(), t.node(), t.signal())) {
            return Optional.of(new StandDown(StandDown.Reason.CLEARED, t.signal() + " is no longer in breach or silent on "
                    + (t.node() == null ? t.cluster().value() : t.cluster() + "/" + t.node()) + ": the problem went away"));
        }
        return Optional.empty();
    }
}
