package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import java.util.List;
import java.util.Objects;

/**
 * What a replay found would have happened (DESIGN.md section 7). {@link #summary()},
 * {@link #runs()} and {@link #decisions()} are the contract; the rest extends it: brake
 * periods, the notifications that would have gone out, the counterfactual masks with the
 * events they hid, the unhealthy-cluster count over time, and the assumptions the replay
 * made (for instance about actions it could not simulate).
 *
 * <p>Immutable. Holds no wall-clock time and no path, so the same recording, policy and
 * seed give an equal report, and {@link ReportJson} gives the same bytes.
 *
 * @param runs         in run-id order
 * @param decisions    in the order the engine made them
 * @param unhealthy    the most unhealthy clusters per interval of {@link ReplayInfo#healthInterval()}, from
 *                     the recording's start to the horizon
 * @param assumptions  sentences, in a fixed order
 */
public record ReplayReport(RecordingInfo recording, ReplayInfo replay, Summary summary, List<RunEntry> runs,
                           List<DecisionEntry> decisions, List<BrakePeriod> brakePeriods,
                           List<NotificationEntry> notifications, List<HiddenMask> masks, List<HealthPoint> unhealthy,
                           List<String> assumptions) {
    public ReplayReport {
        Objects.requireNonNull(recording, "recording");
        Objects.requireNonNull(replay, "replay");
        Objects.requireNonNull(summary, "summary");
        runs = List.copyOf(runs);
        decisions = List.copyOf(decisions);
        brakePeriods = List.copyOf(brakePeriods);
        notifications = List.copyOf(notifications);
        masks = List.copyOf(masks);
        unhealthy = List.copyOf(unhealthy);
        assumptions = List.copyOf(assumptions);
    }
}
