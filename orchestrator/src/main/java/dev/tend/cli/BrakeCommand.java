package dev.tend.cli;

import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.util.concurrent.Callable;

/** {@code tend brake engage|release|status}: the fleet brake of a running server. */
@Command(name = "brake", mixinStandardHelpOptions = true,
        subcommands = {BrakeCommand.Engage.class, BrakeCommand.Release.class, BrakeCommand.Status.class},
        description = "The fleet brake: while engaged, no run starts automatically and running ones pause at a step boundary.")
public final class BrakeCommand implements Runnable {
    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    @Command(name = "engage", mixinStandardHelpOptions = true, description = "Engage the fleet brake by hand (it then releases only by hand).")
    public static final class Engage implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        ServerOptions server;

        @Option(names = "--reason", required = true, paramLabel = "R")
        String reason;

        @Override
        public Integer call() {
            var ops = server.operations();
            var before = ops.brake();
            var after = ops.engageBrake(reason);
            if (before.engaged()) {
                spec.commandLine().getOut().println("the fleet brake was already engaged (since " + Render.time(before.since())
                        + " by " + before.by() + (before.manual() ? "" : ", automatically") + ": " + before.reason()
                        + "); its reason is replaced, and it now releases only by hand");
            }
            spec.commandLine().getOut().println(Render.brake(after));
            return ExitCodes.OK;
        }
    }

    @Command(name = "release", mixinStandardHelpOptions = true, description = "Release the fleet brake; held runs are looked at again.")
    public static final class Release implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        ServerOptions server;

        @Option(names = "--reason", required = true, paramLabel = "R")
        String reason;

        @Override
        public Integer call() {
            spec.commandLine().getOut().println(Render.brake(server.operations().releaseBrake(reason)));
            return ExitCodes.OK;
        }
    }

    @Command(name = "status", mixinStandardHelpOptions = true, description = "Show whether the fleet brake is engaged, since when, by whom and why.")
    public static final class Status implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Mixin
        ServerOptions server;

        @Mixin
        TextOrJsonFormat format;

        @Override
        public Integer call() {
            var b = server.operations().brake();
            if (format.json()) Render.json(spec.commandLine().getOut(), b);
            else spec.commandLine().getOut().println(Render.brake(b));
            return ExitCodes.OK;
        }
    }
}
