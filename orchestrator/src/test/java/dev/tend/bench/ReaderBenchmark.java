package dev.tend.bench;

import dev.tend.engine.Input;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.runtime.NumberedInputs;
import dev.tend.shared.wire.CountingInput;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.shared.wire.WireReader;

import java.io.InputStream;
import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;

/**
 * The work of {@code tend ingest}'s reader thread alone, on one thread: the wire reader over the
 * file's bytes (live clock and declared signals as ingest sets them) and {@link NumberedInputs}, with
 * no driver to hand the inputs to. Prints the thread's CPU time per pass; run it under the
 * launcher's ingest options ({@code -XX:TieredStopAtLevel=1 -XX:+UseSerialGC -Xmn256m}) to see what
 * the reader of {@code tend ingest} pays per line.
 *
 * <p>Usage: {@code ReaderBenchmark EVENTS.jsonl [passes]}.
 */
public final class ReaderBenchmark {
    private ReaderBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        Path events = Path.of(args[0]);
        int passes = args.length > 1 ? Integer.parseInt(args[1]) : 1;
        Path library = Path.of(System.getProperty("tend.library", "playbooks/library"));
        PlaybookSet set = PlaybookLoader.load(library);
        Clock clock = Clock.systemUTC();
        var mx = ManagementFactory.getThreadMXBean();
        for (int p = 0; p < passes; p++) {
            WireReader wire = WireReader.of(events.toString()).withLiveClock(clock::instant, set.config().maxSkew())
                    .withSignals(set.config().signals());
            NumberedInputs inputs = new NumberedInputs();
            long[] check = {0};
            long c0 = mx.getCurrentThreadCpuTime();
            long t0 = System.nanoTime();
            ReadSummary s;
            try (InputStream in = new CountingInput(Files.newInputStream(events))) {
                s = wire.readAll(in, r -> {
                    if (r instanceof LineResult.Event e) {
                        Input next = inputs.of(e);
                        check[0] += ((Input.Transition) next).wire().length() + ((Input.Transition) next).numbered().number();
                    }
                });
            }
            long cpu = mx.getCurrentThreadCpuTime() - c0;
            System.out.printf("pass %d: %d events, %d bad; reader %.2f s CPU, %.2f s wall (check %d)%n", p, s.events(), s.bad(),
                    cpu / 1e9, (System.nanoTime() - t0) / 1e9, check[0]);
        }
    }
}
