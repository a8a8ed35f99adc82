package dev.tend.cli;

import dev.tend.shared.wire.CountingInput;
import dev.tend.audit.CheckpointWriter;
import dev.tend.audit.LedgerKey;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.engine.LedgerKind;
import dev.tend.engine.RunSnapshot;
import dev.tend.executor.ExecutorRegistry;
import dev.tend.http.OutgoingHttp;
import dev.tend.page.Courier;
import dev.tend.page.Senders;
import dev.tend.runtime.NumberedInputs;
import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.Recovery;
import dev.tend.runtime.QuartzTimers;
import dev.tend.runtime.SourceProgress;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.shared.wire.WireReader;
import dev.tend.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * {@code tend ingest FILE|-}: applies transitions as they arrive, runs the engine with the
 * wall clock and executes runs; stops on end of input once no run is executing, or on a
 * signal, leaving runs resumable from the store.
 */
@Command(name = "ingest", mixinStandardHelpOptions = true,
        description = "Apply health transitions (wire format v1, JSON Lines) from FILE or - (standard input), "
                + "decide and execute runs; stop at end of input once no run is executing.")
public final class IngestCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FILE|-")
    String input;

    @Mixin
    PolicyOptions policy;

    @Mixin
    DbOption db;

    @Mixin
    SnapshotOption snapshots;

    @Mixin
    SimulationOptions simulation;

    @Mixin
    LedgerKeyOption ledgerKey;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        InputStream source = open();
        LedgerKey ledger = ledgerKey.load();
        OpeningStore opening = OpeningStore.start(db::open); // beside reading the playbooks and the fleet
        EngineSetup setup;
        OutgoingHttp outgoing;
        Senders senders;
        try {
            setup = policy.setup(EventTimeMode.eventsOnly());
            outgoing = new OutgoingHttp();
            senders = Senders.from(setup.config().paging(), outgoing, err);
        } catch (RuntimeException | Error e) {
            opening.discard();
            throw e;
        }
        Clock clock = Clock.systemUTC();
        if (senders.logOnly()) err.println("tend: warning: no channels are defined in tend.yaml, so pages are written to this log only");
        try (Store store = opening.get();
             ExecutorRegistry.Built executors = ExecutorRegistry.open(
                     new ExecutorRegistry.Settings(Path.of("").toAbsolutePath(), simulation.seed, simulation.speedup, outgoing));
             Courier courier = new Courier(store, senders, clock, Duration.ofSeconds(5), Courier.Listener.NONE)) {
            store.useTransaction(tx -> tx.appendLedger(clock.instant(), LedgerKind.POLICY_LOADED.wire(), PolicyOptions.loaded(setup)));
            CommitRefusals refusals = new CommitRefusals(input, err);
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, executors.byKind(), timers,
                    n -> courier.wake(), clock, refusals, snapshots.policy());
            courier.start();
            timers.fireInto(key -> orch.submit(new Input.TimerFired(key)));
            if (ledger != null) orch.checkpointWith(new CheckpointWriter(store, ledger, CheckpointWriter.EVERY));
            Recovery rec = orch.recover();
            if (rec.inputsReplayed() > 0 || rec.snapshotSeq() > 0) {
                err.println("tend: resumed from " + db.describe() + ": " + rec.describe());
            }
            long skip = input.equals("-") ? 0 : orch.readingFrom(SourceProgress.identity(Path.of(input)));
            if (skip > 0) {
                err.println("tend: the first " + skip + " events of " + input + " are already journaled in " + db.db
                        + "; reading on after them");
            }
            long[] seen = {0};
            AtomicBoolean eof = new AtomicBoolean();
            java.util.concurrent.atomic.AtomicReference<String> readFailure = new java.util.concurrent.atomic.AtomicReference<>();
            ReadSummary[] summary = new ReadSummary[1];
            Progress progress = Progress.onStderr("ingesting " + input, input.equals("-") ? -1 : Files.size(Path.of(input)), err);
            CountingInput counted = new CountingInput(source);
            NumberedInputs inputs = new NumberedInputs();
            WireReader wire = inputs.canonicalIds(WireReader.of(input).withLiveClock(clock::instant, setup.config().maxSkew())
                    .withSignals(setup.config().signals()));
            Thread reader = new Thread(() -> {
                try (InputStream in = counted) {
                    summary[0] = wire.readAll(in, r -> {
                        try {
                            if (r instanceof LineResult.Event e && ++seen[0] > skip) {
                                Input next = inputs.ofCanonical(e);
                                refusals.submitted(next, e.line());
                                orch.submitEvent(next);
                                if (seen[0] % PROGRESS_EVERY == 0) progress.update(counted.count(), seen[0]);
                            } else if (r instanceof LineResult.Bad b && seen[0] >= skip) {
                                err.println(b.problem() + " (line skipped)");
                            }
                        } catch (InterruptedException ie) {
                            Thread.currentThread().interrupt();
                            throw new IllegalStateException(ie);
                        }
                    });
                    progress.update(counted.count(), seen[0]);
                    progress.close();
                    err.println("tend: end of input after " + String.format(java.util.Locale.ROOT, "%,d", seen[0])
                            + " events; waiting for the runs still executing (Ctrl-C stops; they resume on the next start)");
                    err.flush();
                } catch (RuntimeException | IOException e) {
                    progress.close();
                    readFailure.set(e.getMessage());
                    err.println("tend: reading " + input + " stopped: " + e.getMessage());
                } finally {
                    eof.set(true);
                }
            }, "tend-ingest-reader");
            reader.setDaemon(true);
            CountDownLatch reported = new CountDownLatch(1);
            Thread hook = new Thread(() -> {
                // a signal: say where the input stood, stop the driver, and let the main thread print its report
                err.println(progress.summary() + "; the store is consistent and the next start reads on from there");
                err.flush();
                orch.stop();
                try {
                    reported.await(10, TimeUnit.SECONDS);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }, "tend-ingest-stop");
            Runtime.getRuntime().addShutdownHook(hook);
            reader.start();
            orch.runUntil(() -> eof.get() && orch.isIdle());
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // a signal arrived: the store is consistent, runs resume on the next start
            }
            timers.close();
            courier.close();
            // what is due now goes out before the command ends; pages still waiting for a retry go out with the next start on this store
            courier.deliverDue();
            report(out, orch, summary[0]);
            reportTimeRefusals(out, wire);
            out.flush();
            reported.countDown();
            if (readFailure.get() != null) return ExitCodes.USAGE;
            if (refusals.count() > 0) return ExitCodes.FINDINGS;
            return summary[0] != null && summary[0].bad() > 0 ? ExitCodes.FINDINGS : ExitCodes.OK;
        }
    }

    /** Events read between two progress updates. */
    private static final int PROGRESS_EVERY = 1024;


    /** Standard input or the file, opened before anything else so that a missing file is exit 2 with its path. */
    private InputStream open() {
        if (input.equals("-")) return System.in;
        Path file = Path.of(input);
        try {
            if (Files.isDirectory(file)) throw new IOException("it is a directory");
            return Files.newInputStream(file);
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(Problem.at(input, 0, 0, "", "no such file"));
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(input, 0, 0, "", "cannot read the file: " + e.getMessage()));
        }
    }

    private static void reportTimeRefusals(PrintWriter out, WireReader wire) {
        StringBuilder sb = new StringBuilder();
        wire.timeRefusals().forEach((why, n) -> {
            if (n > 0) sb.append(sb.length() == 0 ? "" : ", ").append(n).append(' ').append(why.wireName());
        });
        if (sb.length() > 0) out.println("lines refused for their time: " + sb);
    }

    private static void report(PrintWriter out, Orchestrator orch, ReadSummary s) {
        long started = 0, ok = 0, failed = 0, stoodDown = 0, other = 0;
        for (RunSnapshot r : orch.engine().runs()) {
            if (r.startedAt() != null) started++;
            switch (r.state()) {
                case SUCCEEDED -> ok++;
                case FAILED -> failed++;
                case STOOD_DOWN -> stoodDown++;
                default -> other++;
            }
        }
        out.println("read " + (s == null ? 0 : s.events()) + " events (" + (s == null ? 0 : s.bad()) + " bad lines skipped, "
                + orch.engine().health().lateEvents() + " late); runs: " + started + " started, " + ok + " succeeded, "
                + failed + " failed, " + stoodDown + " stood down, " + other + " waiting or held; "
                + orch.engine().heldCandidates().size()
                + " candidates held or denied");
    }
}
