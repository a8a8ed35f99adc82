package dev.tend.engine;

import dev.tend.shared.fleet.FleetHealthView;

import java.util.Locale;
import java.util.Map;

/**
 * The fleet brake's policy: engages automatically when too many clusters are unhealthy at
 * once (a large-scale event is not a node problem) and sends one aggregated page, releases
 * automatically below the lower threshold, or by hand. After a manual release the
 * automatic brake re-arms only once the fleet fell below the release threshold, so an
 * operator's decision holds for the event at hand.
 */
final class FleetBrake {
    private final BrakeThresholds thresholds;
    private BrakeState state = BrakeState.released();
    private boolean armed = true;
    private int episodes;
    private boolean settling;
    static final String SETTLE_TIMER = "brake:settle";

    FleetBrake(BrakeThresholds thresholds) {
        this.thresholds = thresholds;
    }

    BrakeState state() {
        return state;
    }

    EngineState.BrakeMemo memo() {
        return new EngineState.BrakeMemo(state, armed, episodes, settling);
    }

    void restore(EngineState.BrakeMemo m) {
        state = m.state();
        armed = m.armed();
        episodes = m.episodes();
        settling = m.settling();
    }

    /** Looks at the fleet after a change; returns true when the brake was released. */
    boolean reconsider(FleetHealthView view, Effects fx) {
        int n = view.unhealthyClusterCount();
        double f = view.unhealthyFraction();
        if (!armed && thresholds.mayRelease(n, f)) armed = true;
        if (!state.engaged() && armed && thresholds.shouldEngage(n, f)) {
            episodes++;
            String why = String.format(Locale.ROOT, "%d clusters unhealthy (%.1f%% of the fleet)", n, f * 100);
            state = new BrakeState(true, fx.now(), "automatic", why, false);
            fx.ledger("brake-engaged", "by", "automatic", "reason", why, "unhealthy_clusters", n);
            fx.add(new Effect.Notify("brake/" + episodes, thresholds.channel(),
                    "fleet brake engaged: " + why + "; automatic remediation is on hold fleet-wide",
                    Map.of("unhealthy_clusters", n)));
            fx.add(new Effect.BrakeChanged(state));
            return false;
        }
        boolean below = state.engaged() && !state.manual() && thresholds.autoRelease() && thresholds.mayRelease(n, f);
        if (below && !settling) {
            settling = true;
            if (thresholds.settle().isZero()) return settled(view, fx);
            fx.arm(SETTLE_TIMER, fx.now().plus(thresholds.settle()));
        } else if (!below && settling) {
            settling = false;
            fx.cancel(SETTLE_TIMER);
        }
        return false;
    }

    /** The settle timer fired: releases when the fleet is still below the release thresholds. */
    boolean settled(FleetHealthView view, Effects fx) {
        settling = false;
        int n = view.unhealthyClusterCount();
        if (!state.engaged() || state.manual() || !thresholds.mayRelease(n, view.unhealthyFraction())) return false;
        release("automatic", String.format(Locale.ROOT, "%d clusters unhealthy, below the release threshold for %s", n,
                dev.tend.shared.time.Durations.format(thresholds.settle())), fx);
        return true;
    }

    void engage(String by, String reason, Effects fx) {
        if (state.engaged()) {
            // already engaged (perhaps automatically): a person now holds it, so it releases only by hand
            state = new BrakeState(true, state.since(), by, reason, true);
            fx.ledger("brake-engaged", "by", by, "reason", reason, "manual", true, "already_engaged_since", state.since());
            fx.add(new Effect.BrakeChanged(state));
            return;
        }
        episodes++;
        state = new BrakeState(true, fx.now(), by, reason, true);
        fx.ledger("brake-engaged", "by", by, "reason", reason, "manual", true);
        fx.add(new Effect.BrakeChanged(state));
    }

    boolean releaseByHand(String by, String reason, FleetHealthView view, Effects fx) {
        if (!state.engaged()) return false;
        armed = thresholds.mayRelease(view.unhealthyClusterCount(), view.unhealthyFraction());
        release(by, reason, fx);
        return true;
    }

    private void release(String by, String reason, Effects fx) {
        if (settling) fx.cancel(SETTLE_TIMER);
        settling = false;
        fx.ledger("brake-released", "by", by, "reason", reason, "engaged_since", state.since());
        state = BrakeState.released();
        fx.add(new Effect.BrakeChanged(state));
    }
}
