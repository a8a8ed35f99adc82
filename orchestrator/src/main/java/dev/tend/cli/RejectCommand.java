package dev.tend.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.util.concurrent.Callable;

/** {@code tend reject RUN --reason R}: rejects a pending run; it is cancelled with the reason. */
@Command(name = "reject", mixinStandardHelpOptions = true, description = "Reject a run waiting for a person; it is cancelled.")
public final class RejectCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    ServerOptions server;

    @Parameters(index = "0", paramLabel = "RUN")
    String run;

    @Option(names = "--reason", required = true, paramLabel = "R", description = "why, for the ledger")
    String reason;

    @Override
    public Integer call() {
        spec.commandLine().getOut().println(ApproveCommand.describe(server.operations().reject(run, reason)));
        return ExitCodes.OK;
    }
}
