package dev.tend.cli;

import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;


/**
 * What the operator commands on one run ({@code approve}, {@code reject}, {@code abort}) share:
 * the server and token ({@link ServerOptions}) and the run, the first parameter. A command that
 * needs a reason adds the {@link Reason} mixin.
 */
abstract class RunOperation extends ServerCommand {
    @Parameters(index = "0", paramLabel = "RUN")
    String run;

    /** {@code --reason R}, required: why, for the ledger. */
    static final class Reason {
        @Option(names = "--reason", required = true, paramLabel = "R", description = "why, for the ledger")
        String reason;
    }
}
