package dev.tend.cli;

import dev.tend.api.view.ExclusionRequest;
import dev.tend.api.view.ExclusionView;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.time.Clock;
import java.time.Instant;

/** {@code tend exclude add|remove|list}: the clusters and nodes automation must not touch. */
@Command(name = "exclude", mixinStandardHelpOptions = true,
        subcommands = {ExcludeCommand.Add.class, ExcludeCommand.Remove.class, ExcludeCommand.ListAll.class},
        description = "Manage exclusions on a running tend serve: automation denies every run on an excluded cluster or node.")
public final class ExcludeCommand extends CommandGroup {

    /** {@code tend exclude add CLUSTER [NODE] --reason R --owner O [--until T]}. */
    @Command(name = "add", mixinStandardHelpOptions = true, description = "Exclude a cluster, or one node of it.")
    public static final class Add extends ServerCommand {

        @Parameters(index = "0", paramLabel = "CLUSTER")
        String cluster;

        @Parameters(index = "1", paramLabel = "NODE", arity = "0..1")
        String node;

        @Option(names = "--reason", required = true, paramLabel = "R", description = "why, in your words")
        String reason;

        @Option(names = "--owner", required = true, paramLabel = "O", description = "whose the cluster is, or who to ask")
        String owner;

        @Option(names = "--until", paramLabel = "T",
                description = "RFC 3339 time, or a duration from now (4h); default: until removed")
        String until;

        @Override
        public Integer call() {
            Instant end = until == null ? null : until(until, Clock.systemUTC());
            ExclusionView x = server.operations().exclude(new ExclusionRequest(cluster, node, reason, owner, end));
            out().println("excluded " + Render.target(x.cluster(), x.node())
                    + (x.until() == null ? " until removed" : " until " + Render.time(x.until())) + " (owner " + x.owner() + "): " + x.reason());
            return ExitCodes.OK;
        }
    }

    /** {@code tend exclude remove CLUSTER [NODE]}. */
    @Command(name = "remove", mixinStandardHelpOptions = true, description = "Remove the exclusion of a cluster or a node.")
    public static final class Remove extends ServerCommand {

        @Parameters(index = "0", paramLabel = "CLUSTER")
        String cluster;

        @Parameters(index = "1", paramLabel = "NODE", arity = "0..1")
        String node;

        @Override
        public Integer call() {
            ExclusionView x = server.operations().unexclude(cluster, node);
            out().println("removed the exclusion of " + Render.target(x.cluster(), x.node()));
            return ExitCodes.OK;
        }
    }

    /** {@code tend exclude list}. */
    @Command(name = "list", mixinStandardHelpOptions = true, description = "List exclusions, lapsed ones marked.")
    public static final class ListAll extends ServerCommand {

        @Mixin
        TextOrJsonFormat format;

        @Override
        public Integer call() {
            var list = server.operations().exclusions();
            if (format.json()) Render.json(out(), list);
            else Render.exclusions(out(), list);
            return ExitCodes.OK;
        }
    }

    /** An RFC 3339 time, or a duration from now. */
    static Instant until(String text, Clock clock) {
        return TimeArg.ahead("--until", text, clock);
    }
}
