package dev.tend.cli;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.TendException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

import java.io.PrintWriter;
import java.util.List;

/** The {@code tend} command line. Each subcommand is one class. */
@Command(name = "tend", mixinStandardHelpOptions = true, versionProvider = VersionProvider.class,
        description = "Remediation orchestrator with health gating.",
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {ExitCodes.OK_TEXT, ExitCodes.FINDINGS_TEXT, ExitCodes.USAGE_TEXT})
public final class TendMain implements Runnable {
    /** The subcommands, in the order the help lists them. */
    private static final List<Class<?>> SUBCOMMANDS = List.of(CheckCommand.class, IngestCommand.class, ServeCommand.class,
            RunsCommand.class, AuditCommand.class, HandoverCommand.class, ApprovalsCommand.class, ApproveCommand.class,
            RejectCommand.class, AbortCommand.class, ExcludeCommand.class, BrakeCommand.class, ReplayCommand.class,
            RecordCommand.class, DemoCommand.class, JournalCommand.class, PageCommand.class, CompletionCommand.class);

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    public static void main(String[] args) {
        System.exit(run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true)));
    }

    /** Runs the CLI with the given streams and returns the exit code; used by tests too. */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cli = commandLine(args);
        cli.setOut(out);
        cli.setErr(err);
        cli.setExitCodeExceptionMapper(ExitCodes::forFailure);
        cli.setExecutionExceptionHandler((ex, cmd, parsed) -> {
            if (ex instanceof InvalidInputException || ex instanceof TendException) {
                cmd.getErr().println(ex.getMessage());
            } else if (ex instanceof CommandLine.ParameterException || ex instanceof CommandLine.TypeConversionException) {
                cmd.getErr().println("tend " + cmd.getCommandName() + ": " + ex.getMessage());
                return ExitCodes.USAGE;
            } else {
                cmd.getErr().println("tend: internal failure (" + ex.getClass().getSimpleName() + "); "
                        + FailureTrace.write(ex, args));
                return ExitCodes.USAGE; // DESIGN.md section 8 knows 0, 1 and 2 only
            }
            return ExitCodes.forFailure(ex);
        });
        return cli.execute(args);
    }

    /**
     * The command line for {@code args}: when they name a subcommand, with that one only.
     * picocli builds the model of every option of every subcommand it is given, by reflection:
     * all eighteen took about a quarter of a second of every start, one about a tenth
     * (DEVELOPERS.md, "Ingest"). The help, the version, a misspelt command (with its
     * suggestions) and the completion script see them all.
     */
    static CommandLine commandLine(String[] args) {
        CommandLine cli = new CommandLine(new TendMain());
        String first = args.length > 0 ? args[0] : "";
        Class<?> named = SUBCOMMANDS.stream().filter(c -> !c.equals(CompletionCommand.class))
                .filter(c -> c.getAnnotation(Command.class).name().equals(first)).findFirst().orElse(null);
        for (Class<?> c : named != null ? List.of(named) : SUBCOMMANDS) cli.addSubcommand(c);
        return cli;
    }

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }
}
