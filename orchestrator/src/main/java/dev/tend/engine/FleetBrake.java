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
    static final TimerKey SETTLE_TIMER = new TimerKey.BrakeSettle();
    static final TimerKey PAGE_TIMER = new TimerKey.BrakePage();
    private final java.time.Duration gather;
    /** The episode's page: not sent yet while it gathers the event's size. */
    private boolean pagePending;
    private int peakUnhealthy;
    private double peakFraction;
    private int folded;
    /** The brake engaged by itself in this episode, so it pages (an operator's own engage does not). */
    private boolean autoPaged;

    FleetBrake(BrakeThresholds thresholds) {
        this(thresholds, java.time.Duration.ZERO);
    }

    /**
     * @param gather how long after an automatic engage its page waits, so that it carries the
     *               size the event reached rather than the threshold's
     */
    FleetBrake(BrakeThresholds thresholds, java.time.Duration gather) {
        this.thresholds = thresholds;
        this.gather = gather;
    }

    /**
     * A page that the brake's page covers (a flapping signal, a loop) while the brake is
     * engaged: ledgered as folded into the brake's page and counted in it, not sent. False
     * when the brake is released (then the page goes out on its own).
     */
    boolean fold(String pageId, String kind, String message, Map<String, Object> fields, Effects fx) {
        if (!state.engaged() || !autoPaged) return false;
        folded++;
        Map<String, Object> f = new java.util.LinkedHashMap<>(fields);
        f.put("id", pageId);
        f.put("page_kind", kind);
        f.put("message", message);
        f.put("into", "brake/" + episodes);
        f.put("sent", !pagePending);
        fx.add(new Effect.Ledger(LedgerKind.PAGE_FOLDED, f));
        return true;
    }

    /** The gather time is over: the episode's one page goes out, with the count and the pages folded into it. */
    void pageDue(Effects fx) {
        if (!pagePending) return;
        page(fx);
    }

    private void page(Effects fx) {
        pagePending = false;
        String size = String.format(Locale.ROOT, "%d clusters unhealthy (%.1f%% of the fleet)", peakUnhealthy, peakFraction * 100);
        String foldedText = folded == 0 ? "" : "; " + folded + (folded == 1 ? " other page" : " other pages") + " folded into this one";
        Map<String, Object> f = new java.util.LinkedHashMap<>();
        f.put("unhealthy_clusters", peakUnhealthy);
        f.put("folded_pages", folded);
        f.put("engaged_at", state.since() == null ? null : Effects.normalise(state.since()));
        fx.add(new Effect.Notify("brake/" + episodes, PageKind.BRAKE, thresholds.channel(),
                "fleet brake engaged: " + size + "; automatic remediation is on hold fleet-wide" + foldedText, f));
    }

    BrakeState state() {
        return state;
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
            fx.ledger(LedgerKind.BRAKE_ENGAGED, "by", "automatic", "reason", why, "unhealthy_clusters", n);
            pagePending = true;
            autoPaged = true;
            peakUnhealthy = n;
            peakFraction = f;
            folded = 0;
            if (gather.isZero()) page(fx);
            else fx.arm(PAGE_TIMER, fx.now().plus(gather));
            fx.add(new Effect.BrakeChanged(state));
            return false;
        }
        if (pagePending && n > peakUnhealthy) {
            peakUnhealthy = n;
            peakFraction = f;
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
            fx.ledger(LedgerKind.BRAKE_ENGAGED, "by", by, "reason", reason, "manual", true, "already_engaged_since", state.since());
            fx.add(new Effect.BrakeChanged(state));
            return;
        }
        episodes++;
        state = new BrakeState(true, fx.now(), by, reason, true);
        fx.ledger(LedgerKind.BRAKE_ENGAGED, "by", by, "reason", reason, "manual", true);
        fx.add(new Effect.BrakeChanged(state));
    }

    boolean releaseByHand(String by, String reason, FleetHealthView view, Effects fx) {
        if (!state.engaged()) return false;
        armed = thresholds.mayRelease(view.unhealthyClusterCount(), view.unhealthyFraction());
        release(by, reason, fx);
        return true;
    }

    private void release(String by, String reason, Effects fx) {
        if (pagePending) {
            // released before the page went out: a person should still hear that it engaged
            fx.cancel(PAGE_TIMER);
            page(fx);
        }
        autoPaged = false;
        if (settling) fx.cancel(SETTLE_TIMER);
        settling = false;
        fx.ledger(LedgerKind.BRAKE_RELEASED, "by", by, "reason", reason, "engaged_since", state.since());
        state = BrakeState.released();
        fx.add(new Effect.BrakeChanged(state));
    }
}
