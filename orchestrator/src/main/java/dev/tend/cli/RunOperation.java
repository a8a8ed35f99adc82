package dev.tend.cli;

import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.util.concurrent.Callable;

/**
 * What the operator commands on one run ({@code approve}, {@code reject}, {@code abort}) share:
 * the server and token ({@link ServerOptions}) and the run, the first parameter. A command that
 * needs a reason adds the {@link Reason} mixin.
 */
abstract class RunOperation implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    ServerOptions server;

    @Parameters(index = "0", paramLabel = "RUN")
    String run;

    /** Where the command's answer goes. */
    PrintWriter out() {
        return spec.commandLine().getOut();
    }

    /** {@code --reason R}, required: why, for the ledger. */
    static final class Reason {
        @Option(names = "--reason", required = true, paramLabel = "R", description = "why, for the ledger")
        String reason;
    }
}
