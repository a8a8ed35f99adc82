package dev.tend.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;


/** {@code tend approvals}: the approvals of a running server, pending ones by default. */
@Command(name = "approvals", mixinStandardHelpOptions = true, description = "List approvals (pending by default) of a running tend serve.")
public final class ApprovalsCommand extends ServerCommand {

    @Option(names = "--state", defaultValue = "pending", paramLabel = "S",
            description = "pending, approved, rejected, lapsed, withdrawn or all (default: ${DEFAULT-VALUE})")
    String state;

    @Mixin
    TextOrJsonFormat format;

    @Override
    public Integer call() {
        var list = server.operations().approvals(state);
        if (format.json()) Render.json(out(), list);
        else Render.approvals(out(), list);
        return ExitCodes.OK;
    }
}
