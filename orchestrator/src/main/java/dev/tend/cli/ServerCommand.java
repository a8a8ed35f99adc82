package dev.tend.cli;

import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.util.concurrent.Callable;

/**
 * What every command that talks to a running {@code tend serve} shares: the server and token
 * ({@link ServerOptions}) and where the answer goes. picocli reads the annotated fields of a
 * superclass as the subclass's own.
 */
abstract class ServerCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    ServerOptions server;

    /** Where the command's answer goes. */
    PrintWriter out() {
        return spec.commandLine().getOut();
    }
}
