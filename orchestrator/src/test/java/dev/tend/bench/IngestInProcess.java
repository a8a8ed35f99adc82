package dev.tend.bench;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.executor.Executor;
import dev.tend.executor.SimulatedExecutor;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.runtime.Orchestrator;
import dev.tend.runtime.QuartzTimers;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.WireReader;
import dev.tend.store.Store;

import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.Map;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * The ingest benchmark's second form ({@code --in-process yes}): the floor and tend's durable
 * path in the benchmark's own JVM, one after the other, with the CPU of each of tend's
 * threads (driver, reader, compiler, collector). For finding where tend's time goes; the
 * figure users see is the fresh-process one of {@link IngestBenchmark}, since here the floor
 * warms up Jackson and SQLite for tend and the JVM's options are not the launcher's.
 */
final class IngestInProcess {
    private IngestInProcess() {
    }

    static void run(Path events, Path fleetFile, Path dir, int n, int snapshotEvery) throws Exception {
        long c0 = ChildProcess.ownCpuNanos();
        long t0 = System.nanoTime();
        IngestFloor.run(events, dir.resolve("floor.db"));
        double floor = n / ((System.nanoTime() - t0) / 1e9);
        long c1 = ChildProcess.ownCpuNanos();
        System.out.printf("floor  (Jackson parse + batched SQLite insert): %,.0f events/s, %.2f s CPU%n", floor, (c1 - c0) / 1e9);
        long[] cpu = new long[1];
        Map<String, Long> threadsBefore = ThreadCpu.byName();
        double tend = n / (tend(events, fleetFile, dir.resolve("tend.db"), snapshotEvery, cpu) / 1e9);
        System.out.printf("         CPU by thread: %s%n", ThreadCpu.since(threadsBefore));
        System.out.printf("tend   (journal + engine + ledger, durable):   %,.0f events/s, %.2f s CPU%n", tend, cpu[0] / 1e9);
        System.out.printf("ratio  tend/floor = %.2f by wall clock (target >= 0.50), %.2f by CPU time%n", tend / floor,
                (double) (c1 - c0) / cpu[0]);
    }

    /** Returns the wall time until every event is committed; {@code cpu[0]}: this process's CPU time meanwhile. */
    static long tend(Path events, Path fleetFile, Path db, int snapshotEvery, long[] cpu) throws Exception {
        Path library = Path.of(System.getProperty("tend.library", "playbooks/library"));
        if (!Files.isDirectory(library)) library = Path.of("..").resolve(library);
        PlaybookSet set = PlaybookLoader.load(library);
        Fleet fleet = FleetFile.load(fleetFile);
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        Clock clock = Clock.systemUTC();
        long t0 = System.nanoTime();
        long c0 = ChildProcess.ownCpuNanos();
        try (Store store = Store.openSqlite(db); Executor sim = new SimulatedExecutor(1, 1_000_000)) {
            QuartzTimers timers = new QuartzTimers();
            Orchestrator orch = new Orchestrator(store, setup, Map.of("simulated", sim), timers, x -> { }, clock,
                    dev.tend.runtime.CommitListener.NONE, snapshotEvery);
            timers.fireInto(k -> orch.submit(new Input.TimerFired(k)));
            AtomicBoolean eof = new AtomicBoolean();
            dev.tend.runtime.NumberedInputs inputs = new dev.tend.runtime.NumberedInputs();
            long[] readerCpu = new long[1];
            Thread reader = new Thread(() -> {
                try (InputStream in = Files.newInputStream(events)) {
                    WireReader.of(events.toString()).readAll(in, r -> {
                        if (r instanceof LineResult.Event e) {
                            try {
                                orch.submitEvent(inputs.of(e));
                            } catch (InterruptedException ie) {
                                throw new IllegalStateException(ie);
                            }
                        }
                    });
                } catch (Exception e) {
                    throw new IllegalStateException(e);
                } finally {
                    readerCpu[0] = java.lang.management.ManagementFactory.getThreadMXBean().getCurrentThreadCpuTime();
                    eof.set(true);
                }
            });
            reader.start();
            // timed until every event is committed; runs still going then may finish for 5 s more, untimed
            orch.runUntil(eof::get);
            long took = System.nanoTime() - t0;
            cpu[0] = ChildProcess.ownCpuNanos() - c0;
            long until = System.nanoTime() + 5_000_000_000L;
            orch.runUntil(() -> orch.isIdle() || System.nanoTime() > until);
            timers.close();
            System.out.printf("         reader thread (wire reader): %.2f s CPU%n", readerCpu[0] / 1e9);
            System.out.printf("         runs: %d (%d still running after 5 s more)%n", orch.engine().runs().size(), orch.engine().activeRuns());
            return took;
        }
    }
}
