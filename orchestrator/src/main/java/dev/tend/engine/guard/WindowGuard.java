package dev.tend.engine.guard;

import dev.tend.engine.Candidate;
import dev.tend.playbooks.ChangeWindow;
import dev.tend.playbooks.Freeze;
import dev.tend.shared.ReasonCode;

import java.time.Instant;
import java.util.Map;
import java.util.Optional;

/**
 * Holds outside the playbook's change window or inside a freeze, until the exact instant
 * the window next opens outside every freeze (correct across daylight-saving changes, as
 * the window is computed in its own time zone).
 */
public final class WindowGuard implements Guard {
    private static final int MAX_HOPS = 64;

    @Override
    public ReasonCode code() {
        return ReasonCode.WINDOW_CLOSED;
    }

    @Override
    public Optional<Objection> check(Candidate c, GuardContext ctx) {
        var spec = ctx.health().clusterSpec(c.target().cluster());
        Map<String, String> tags = spec != null ? spec.tags() : Map.of();
        Instant now = ctx.now();
        if (isAllowed(c, ctx, tags, now)) return Optional.empty();
        Instant t = now;
        String why = describe(c, ctx, tags, now);
        for (int i = 0; i < MAX_HOPS; i++) {
            Instant next = t;
            ChangeWindow w = c.playbook().window();
            if (w != null) next = w.nextOpening(next);
            for (Freeze f : ctx.config().freezes()) {
                if (f.covers(next, tags)) next = f.until();
            }
            if (next.equals(t) || isAllowed(c, ctx, tags, next)) {
                return Optional.of(Objection.until(code(), next, why + "; next opening at " + next));
            }
            t = next;
        }
        return Optional.of(Objection.on(code(), Wake.HUMAN, why + "; no opening found in the next " + MAX_HOPS + " windows"));
    }

    private static boolean isAllowed(Candidate c, GuardContext ctx, Map<String, String> tags, Instant t) {
        ChangeWindow w = c.playbook().window();
        if (w != null && !w.isOpen(t)) return false;
        for (Freeze f : ctx.config().freezes()) if (f.covers(t, tags)) return false;
        return true;
    }

    private static String describe(Candidate c, GuardContext ctx, Map<String, String> tags, Instant t) {
        for (Freeze f : ctx.config().freezes()) {
            if (f.covers(t, tags)) return "inside the freeze '" + f.reason() + "' until " + f.until();
        }
        return "outside the change window of " + c.playbook().id();
    }
}
