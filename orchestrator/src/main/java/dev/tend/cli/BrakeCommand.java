package dev.tend.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;


/** {@code tend brake engage|release|status}: the fleet brake of a running server. */
@Command(name = "brake", mixinStandardHelpOptions = true,
        subcommands = {BrakeCommand.Engage.class, BrakeCommand.Release.class, BrakeCommand.Status.class},
        description = "The fleet brake: while engaged, no run starts automatically and running ones pause at a step boundary.")
public final class BrakeCommand extends CommandGroup {

    @Command(name = "engage", mixinStandardHelpOptions = true, description = "Engage the fleet brake by hand (it then releases only by hand).")
    public static final class Engage extends ServerCommand {

        @Option(names = "--reason", required = true, paramLabel = "R")
        String reason;

        @Override
        public Integer call() {
            var ops = server.operations();
            var before = ops.brake();
            var after = ops.engageBrake(reason);
            if (before.engaged()) {
                out().println("the fleet brake was already engaged (since " + Render.time(before.since())
                        + " by " + before.by() + (before.manual() ? "" : ", automatically") + ": " + before.reason()
                        + "); its reason is replaced, and it now releases only by hand");
            }
            out().println(Render.brake(after));
            return ExitCodes.OK;
        }
    }

    @Command(name = "release", mixinStandardHelpOptions = true, description = "Release the fleet brake; held runs are looked at again.")
    public static final class Release extends ServerCommand {

        @Option(names = "--reason", required = true, paramLabel = "R")
        String reason;

        @Override
        public Integer call() {
            out().println(Render.brake(server.operations().releaseBrake(reason)));
            return ExitCodes.OK;
        }
    }

    @Command(name = "status", mixinStandardHelpOptions = true, description = "Show whether the fleet brake is engaged, since when, by whom and why.")
    public static final class Status extends ServerCommand {

        @Mixin
        TextOrJsonFormat format;

        @Override
        public Integer call() {
            var b = server.operations().brake();
            if (format.json()) Render.json(out(), b);
            else out().println(Render.brake(b));
            return ExitCodes.OK;
        }
    }
}
