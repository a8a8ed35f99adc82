package dev.tend.cli;

import dev.tend.api.view.RunView;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;

/**
 * {@code tend abort RUN --reason R}: cancels an active run (running, paused, held, waiting
 * for approval or for a person) on the running server; the reason and who gave it go into
 * the ledger. A run that already ended is a refusal (exit 1).
 */
@Command(name = "abort", mixinStandardHelpOptions = true,
        description = "Abort an active run: it is cancelled, and the reason and who gave it go into the ledger."
                + " Exit 1 if the run already ended.")
public final class AbortCommand extends RunOperation {
    @Mixin
    Reason reason;

    @Override
    public Integer call() {
        RunView r = server.operations().abort(run, reason.reason);
        out().println("aborted " + r.run() + " (" + r.playbook() + " on " + Render.target(r.cluster(), r.node())
                + "): run " + r.state() + (r.endedAt() == null ? "" : " at " + Render.time(r.endedAt()))
                + (r.outcome() == null ? "" : "; " + r.outcome()));
        return ExitCodes.OK;
    }
}
