package dev.tend.simulator;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.simulator.report.HiddenMask;

import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * The replay's counterfactual memory of the fleet (DESIGN.md section 7). Once a simulated
 * action succeeded and cleared signal S on a target, the recording, which was made in a
 * world where nobody fixed it, keeps reporting S as breach or silent there; those events are
 * hidden from the engine until the recording itself shows S clear on that target (the
 * real-world fix). After that the mask is lifted and new problems count again.
 *
 * <p>Every hidden event is counted against its mask, so a report can say how many events
 * were hidden and why. Not thread-safe: the replay driver owns one.
 */
public final class FleetModel {
    private static final class Active {
        final SignalKey key;
        final Instant maskedAt;
        final String run;
        final String action;
        Instant liftedAt;
        long hidden;

        Active(SignalKey key, Instant maskedAt, String run, String action) {
            this.key = key;
            this.maskedAt = maskedAt;
            this.run = run;
            this.action = action;
        }

        HiddenMask snapshot() {
            return new HiddenMask(key.cluster(), key.node(), key.signal(), maskedAt, run, action, liftedAt, hidden);
        }
    }

    private final Map<SignalKey, Active> active = new HashMap<>();
    /** Clusters with an active mask, and how many: most events are on other clusters and need no key. */
    private final Map<dev.tend.shared.Id, Integer> maskedClusters = new HashMap<>();
    private final List<Active> all = new ArrayList<>();
    private long hiddenEvents;

    /**
     * A simulated action of {@code run} cleared {@code key} at {@code at} while the recording
     * still showed a problem there: from now on the recorded problem events of {@code key}
     * are hidden. A key that is masked already stays under its first mask.
     */
    public void mask(SignalKey key, Instant at, String run, String action) {
        Objects.requireNonNull(key, "key");
        Objects.requireNonNull(at, "at");
        if (active.containsKey(key)) return;
        Active a = new Active(key, at, run, action);
        active.put(key, a);
        maskedClusters.merge(key.cluster(), 1, Integer::sum);
        all.add(a);
    }

    /**
     * Whether a recorded transition reaches the engine. A breach or silent event of a masked
     * key is hidden (false) and counted; a clear of a masked key lifts the mask and is let
     * through, as is every event of a key without a mask.
     */
    public boolean admits(HealthTransition t) {
        if (active.isEmpty() || !maskedClusters.containsKey(t.cluster())) return true;
        Active a = active.get(t.key());
        if (a == null) return true;
        if (t.state() == SignalState.CLEAR) {
            a.liftedAt = t.at().isBefore(a.maskedAt) ? a.maskedAt : t.at();
            active.remove(t.key());
            if (maskedClusters.merge(t.cluster(), -1, Integer::sum) == 0) maskedClusters.remove(t.cluster());
            return true;
        }
        a.hidden++;
        hiddenEvents++;
        return false;
    }

    /** True while {@code key} is masked. */
    public boolean isMasked(SignalKey key) {
        return active.containsKey(key);
    }

    /** Recorded events hidden so far, over all masks. */
    public long hiddenEvents() {
        return hiddenEvents;
    }

    /** Every mask so far, in the order they began, lifted or not. */
    public List<HiddenMask> masks() {
        List<HiddenMask> out = new ArrayList<>(all.size());
        for (Active a : all) out.add(a.snapshot());
        return out;
    }
}
