package dev.tend.cli;

import dev.tend.playbooks.PlaybookSet;
import dev.tend.replay.Replayer;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.TendException;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.ComparisonHtml;
import dev.tend.simulator.report.ComparisonJson;
import dev.tend.simulator.report.ComparisonText;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.ReportComparison;
import dev.tend.simulator.report.ReportHtml;
import dev.tend.simulator.report.ReportJson;
import dev.tend.simulator.report.ReportText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.FutureTask;

/**
 * {@code tend replay RECORDING}: runs a recording through the engine in virtual time with
 * simulated executors and reports what would have happened; with {@code --against}, runs a
 * second playbook set on the same recording and seed and reports the differences.
 */
@Command(name = "replay", mixinStandardHelpOptions = true,
        description = "Replay a recording through the decision engine in virtual time, against a fleet model, and report"
                + " what would have happened: runs, verdicts with reasons, holds, the fleet brake, events hidden by simulated fixes.%n"
                + "Exit 0 ok; 1 when lines of the recording were skipped, or with --against when the two sets differ;"
                + " 2 usage or input error.")
public final class ReplayCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RECORDING", description = "a recording: JSON Lines of wire format v1, optionally with a header line")
    Path recording;

    /** {@code --playbooks DIR [--config FILE] [--actions FILE]}; {@code --config} and {@code --actions} apply to {@code --against} too. */
    @Mixin
    PolicySource policy;

    @Option(names = "--fleet", paramLabel = "FILE", description = "fleet file (default: the one the recording's header names, relative to the recording)")
    Path fleet;

    @Option(names = "--against", paramLabel = "DIR", description = "a second playbook directory to replay on the same recording and seed, and compare")
    Path against;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "N", description = "seed of simulated outcomes (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--format", defaultValue = "text", converter = OutputFormat.TextJsonOrHtml.class,
            completionCandidates = OutputFormat.TextJsonOrHtml.class, description = "text, json or html (default: ${DEFAULT-VALUE})")
    OutputFormat format;

    @Option(names = "--out", paramLabel = "FILE", description = "write the report here instead of standard output")
    Path out;

    @Override
    public Integer call() throws IOException {
        PrintWriter err = spec.commandLine().getErr();
        Recording rec = Recording.open(recording);
        // the fleet file loads on a second thread while the playbooks load here (a start-up users wait
        // for at every replay); a fleet that cannot be read is still the first error reported
        FutureTask<Fleet> fleetLoad = new FutureTask<>(() -> fleet != null ? FleetFile.load(fleet)
                : rec.headerFleet().orElseThrow(() -> new InvalidInputException(Problem.at(recording.toString(), 0, 0, "fleet",
                        "the recording's header names no fleet file, and no --fleet was given: pass --fleet FILE"
                                + " (for the bundled library: playbooks/library/fleet.yaml)"))));
        Thread loader = new Thread(fleetLoad, "tend-fleet-loader");
        loader.setDaemon(true);
        loader.start();
        PlaybookSet mine = null;
        PlaybookSet theirs = null;
        RuntimeException policyFailure = null;
        try {
            mine = policy(policy.playbooks);
            theirs = against == null ? null : policy(against);
        } catch (RuntimeException e) {
            policyFailure = e;
        }
        Fleet topology = joined(fleetLoad, "loading the fleet");
        if (policyFailure != null) throw policyFailure;
        PlaybookSet a = mine;
        PlaybookSet b = theirs;

        if (b == null) {
            ReplayReport first = replay(a, topology, rec, "replaying " + recording.getFileName(), err);
            boolean skipped = first.recording().badLines() > 0;
            write(switch (format) {
                case json -> ReportJson.toJson(first);
                case html -> ReportHtml.render(first);
                default -> ReportText.render(first);
            });
            return skipped ? ExitCodes.FINDINGS : ExitCodes.OK;
        }
        // the second policy replays on its own thread at the same time, from the same reading of the file
        // (each replay is a fresh engine of its own: the reports are those of one after the other);
        // progress and bad lines are the first's
        List<ReplayReport> both = replayBoth(a, b, topology, rec, "replaying " + recording.getFileName() + " with "
                + policy.playbooks.getFileName() + " and " + against.getFileName(), err);
        ReplayReport first = both.get(0);
        boolean skipped = first.recording().badLines() > 0;
        ReplayReport second = both.get(1);
        ReportComparison c = ReportComparison.of(policy.playbooks.toString(), first, against.toString(), second);
        write(switch (format) {
            case json -> ComparisonJson.toJson(c);
            case html -> ComparisonHtml.render(c);
            default -> ComparisonText.render(c);
        });
        return skipped || !c.isSame() ? ExitCodes.FINDINGS : ExitCodes.OK;
    }

    /** One replay, its progress on standard error, and where it stood if a signal stops it. */
    private ReplayReport replay(PlaybookSet set, Fleet topology, Recording rec, String task, PrintWriter err) throws IOException {
        Progress progress = Progress.onStderr(task, Files.size(recording), err);
        try (StopSummary onSignal = new StopSummary(err, () -> progress.summary() + "; no report was written")) {
            return Replayer.of(set, topology, seed).replay(rec, new ReplayProgress(err, progress));
        } finally {
            progress.close();
        }
    }

    /** Two replays at once ({@link Replayer#replayWith}), the first's progress on standard error. */
    private List<ReplayReport> replayBoth(PlaybookSet a, PlaybookSet b, Fleet topology, Recording rec, String task, PrintWriter err)
            throws IOException {
        Progress progress = Progress.onStderr(task, Files.size(recording), err);
        try (StopSummary onSignal = new StopSummary(err, () -> progress.summary() + "; no report was written")) {
            return Replayer.of(a, topology, seed).replayWith(Replayer.of(b, topology, seed), rec, new ReplayProgress(err, progress));
        } finally {
            progress.close();
        }
    }

    /** What the task on the other thread gave; what it threw, thrown here. */
    private static <T> T joined(FutureTask<T> task, String what) {
        try {
            return task.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new TendException(what + " was interrupted", e);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException r) throw r;
            if (e.getCause() instanceof Error r) throw r;
            throw new TendException(what + " failed: " + e.getCause(), e.getCause());
        }
    }

    private PlaybookSet policy(Path dir) {
        if (!Files.isDirectory(dir)) {
            throw new InvalidInputException(Problem.at(dir.toString(), 0, 0, "", "not a directory of playbooks"));
        }
        return policy.load(dir);
    }

    private void write(String text) {
        if (out == null) {
            PrintWriter o = spec.commandLine().getOut();
            o.print(text);
            o.flush();
            return;
        }
        try {
            Path dir = out.toAbsolutePath().getParent();
            if (dir != null) Files.createDirectories(dir);
            try (Writer w = Files.newBufferedWriter(out, StandardCharsets.UTF_8)) {
                w.write(text);
            }
        } catch (IOException e) {
            throw new TendException("cannot write the report to " + out + ": " + e.getMessage(), e);
        }
        spec.commandLine().getErr().println("tend: report written to " + out);
    }
}
