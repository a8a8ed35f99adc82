package dev.tend.cli;

import dev.tend.api.view.ApprovalOutcome;
import picocli.CommandLine.Command;

/**
 * {@code tend approve RUN}: approves a pending run. Every guard is checked again: the run
 * starts, or waits held (fleet brake, exclusion, quorum...) and starts when the hold clears.
 */
@Command(name = "approve", mixinStandardHelpOptions = true,
        description = "Approve a run waiting for a person. The guards are checked again; the answer says whether it started or is held.")
public final class ApproveCommand extends RunOperation {
    @Override
    public Integer call() {
        ApprovalOutcome o = server.operations().approve(run);
        out().println(describe(o));
        return ExitCodes.OK;
    }

    static String describe(ApprovalOutcome o) {
        String target = Render.target(o.approval().cluster(), o.approval().node());
        String head = o.approval().state() + " " + o.approval().run() + " (" + o.approval().playbook() + " on " + target + ")";
        if (o.verdict() == null) return head + "; run " + o.run().state();
        if (o.verdict().equals("start")) return head + "; guards passed: run " + o.run().state();
        return head + "; verdict " + o.verdict() + " " + String.join(",", o.reasons()) + ": run " + o.run().state()
                + (o.verdict().equals("hold") ? ", it starts when the hold clears" : "");
    }
}
