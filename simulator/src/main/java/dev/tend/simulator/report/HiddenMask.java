package dev.tend.simulator.report;

import dev.tend.shared.Id;

import java.time.Instant;
import java.util.Objects;

/**
 * One counterfactual mask of a replay: a simulated action of {@code run} ({@code action})
 * cleared {@code signal} on the target at {@code maskedAt}, so the recorded breach/silent
 * events of that signal there were hidden from the engine until the recording itself showed
 * it clear ({@code liftedAt}; null when it never did before the recording ended).
 *
 * @param node          null for a cluster-level signal
 * @param hiddenEvents  recorded events hidden by this mask, at least 0
 */
public record HiddenMask(Id cluster, Id node, Id signal, Instant maskedAt, String run, String action,
                         Instant liftedAt, long hiddenEvents) {
    public HiddenMask {
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(signal, "signal");
        Objects.requireNonNull(maskedAt, "maskedAt");
        Objects.requireNonNull(run, "run");
        Objects.requireNonNull(action, "action");
        if (liftedAt != null && liftedAt.isBefore(maskedAt)) {
            throw new IllegalArgumentException("liftedAt (" + liftedAt + ") must not be before maskedAt (" + maskedAt + ")");
        }
        if (hiddenEvents < 0) throw new IllegalArgumentException("hiddenEvents must be at least 0, got " + hiddenEvents);
    }

    /** Why the events were hidden, in a sentence. */
    public String reason() {
        return signal + " on " + (node == null ? cluster.value() : cluster + "/" + node) + " was cleared by run " + run
                + " (" + action + ") in the replay; the recording still showed it until "
                + (liftedAt == null ? "its end" : liftedAt.toString());
    }
}
