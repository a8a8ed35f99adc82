package dev.tend.cli;

import dev.tend.api.view.ApprovalOutcome;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.util.concurrent.Callable;

/**
 * {@code tend approve RUN}: approves a pending run. Every guard is checked again: the run
 * starts, or waits held (fleet brake, exclusion, quorum...) and starts when the hold clears.
 */
@Command(name = "approve", mixinStandardHelpOptions = true,
        description = "Approve a run waiting for a person. The guards are checked again; the answer says whether it started or is held.")
public final class ApproveCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    ServerOptions server;

    @Parameters(index = "0", paramLabel = "RUN")
    String run;

    @Override
    public Integer call() {
        ApprovalOutcome o = server.operations().approve(run);
        spec.commandLine().getOut().println(describe(o));
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
