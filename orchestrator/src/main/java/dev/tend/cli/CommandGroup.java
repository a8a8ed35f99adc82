package dev.tend.cli;

import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** A command that only groups subcommands ({@code tend brake}, {@code tend exclude}, ...): run alone, it prints its usage. */
abstract class CommandGroup implements Runnable {
    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }
}
