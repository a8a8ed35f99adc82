package dev.tend.engine;

import dev.tend.engine.guard.Decision;
import dev.tend.shared.ReasonCode;

import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;

/**
 * The pages that go out once, not at every look: a flapping signal pages once per episode
 * (until it is calm again), and a loop stops automation on its target and escalates once
 * (until a person clears it).
 */
final class Escalations {
    private final EngineContext ctx;
    private final Set<Candidate.Key> flapPaged = new HashSet<>();

    Escalations(EngineContext ctx) {
        this.ctx = ctx;
    }

    /** After every evaluation: a candidate whose signal is calm again may page again later. */
    void evaluated(Candidate c, Decision d) {
        if (!d.has(ReasonCode.FLAPPING)) flapPaged.remove(c.key());
    }

    void started(Candidate c) {
        flapPaged.remove(c.key());
    }

    /** For a hold or deny: pages what has not been paged yet. */
    void held(Candidate c, Decision d, Effects fx) {
        if (d.has(ReasonCode.FLAPPING) && flapPaged.add(c.key())) {
            page("flapping/" + c.key() + "/" + ctx.now, PageKind.FLAPPING, c, c.trigger() + " is flapping; "
                    + c.playbook().id() + " holds until it settles", fx);
        }
        if (d.has(ReasonCode.LOOP) && ctx.loopStopped.add(c.key())) {
            fx.ledger(LedgerKind.LOOP_STOPPED, "playbook", c.playbook().id(), "cluster", c.target().cluster(), "node", c.target().node());
            page("loop/" + c.key() + "/" + ctx.now, PageKind.LOOP, c, c.playbook().id() + " keeps remediating "
                    + c.target() + "; automation stopped there until a person clears it", fx);
        }
    }

    /** Sends the page, or folds it into the brake's page while the brake is engaged (one page for a large event). */
    private void page(String id, String kind, Candidate c, String message, Effects fx) {
        Map<String, Object> fields = new LinkedHashMap<>();
        fields.put("playbook", c.playbook().id().value());
        fields.put("cluster", c.target().cluster().value());
        if (c.target().node() != null) fields.put("node", c.target().node().value());
        if (ctx.brake.fold(id, kind, message, fields, fx)) return;
        fx.add(new Effect.Notify(id, kind, ctx.config.paging().channel().value(), message, fields));
    }
}
