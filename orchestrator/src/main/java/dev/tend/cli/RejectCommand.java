package dev.tend.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

/** {@code tend reject RUN --reason R}: rejects a pending run; it is cancelled with the reason. */
@Command(name = "reject", mixinStandardHelpOptions = true, description = "Reject a run waiting for a person; it is cancelled.")
public final class RejectCommand extends RunOperation {
    @Mixin
    Reason reason;

    @Override
    public Integer call() {
        out().println(ApproveCommand.describe(server.operations().reject(run, reason.reason)));
        return ExitCodes.OK;
    }
}
