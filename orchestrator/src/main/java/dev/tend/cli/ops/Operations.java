package dev.tend.cli.ops;

import dev.tend.api.view.ApprovalOutcome;
import dev.tend.api.view.ApprovalView;
import dev.tend.api.view.BrakeView;
import dev.tend.api.view.ExclusionRequest;
import dev.tend.api.view.ExclusionView;
import dev.tend.api.view.RunView;

import java.util.List;

/**
 * The operator commands of the CLI, whatever carries them: {@link HttpOperations} talks to a
 * running {@code tend serve}; a mode directly on the database would be a second implementation.
 * Every method throws {@link OperationRefusedException} when the other side refuses, and a
 * {@link dev.tend.shared.TendException} when it cannot be reached.
 */
public interface Operations {
    /** Approvals in {@code state} (pending, approved, rejected, lapsed, withdrawn or all). */
    List<ApprovalView> approvals(String state);

    ApprovalOutcome approve(String run);

    ApprovalOutcome reject(String run, String reason);

    /** Aborts an active run (cancelled at once; a step in flight is not called again); returns the run as it ended. */
    RunView abort(String run, String reason);

    List<ExclusionView> exclusions();

    ExclusionView exclude(ExclusionRequest request);

    /** Removes the exclusion of a cluster ({@code node} null) or a node; returns what was removed. */
    ExclusionView unexclude(String cluster, String node);

    BrakeView brake();

    BrakeView engageBrake(String reason);

    BrakeView releaseBrake(String reason);
}
