package dev.tend.cli;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.TendException;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.RecordingHeader;
import dev.tend.shared.wire.WireReader;
import dev.tend.shared.wire.WireWriter;
import dev.tend.simulator.synth.Synthesizer;
import dev.tend.store.InputRow;
import dev.tend.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.Callable;

/**
 * {@code tend record}: writes a recording, either exported from the input journal that
 * {@code tend ingest} keeps ({@code --db}), or synthetic ({@code --synthesize}).
 */
@Command(name = "record", mixinStandardHelpOptions = true,
        description = "Write a recording for `tend replay`: the transitions and topology events of the input journal"
                + " between --from and --until (--db), or a synthetic one with its fleet file (--synthesize).%n"
                + "Exit 0 ok, 2 usage or input error.")
public final class RecordCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    DbOption db;

    @Option(names = "--from", paramLabel = "T", description = "RFC 3339 time, clock time (22:00) or duration ago (8h); event time, inclusive")
    String from;

    @Option(names = "--until", paramLabel = "T", description = "event time, exclusive")
    String until;

    @Option(names = "--cluster", paramLabel = "C", description = "only this cluster (repeat for more; default: all)")
    List<String> clusters;

    @Option(names = "--fleet", paramLabel = "FILE", description = "a fleet file to name in the header (written relative to the recording)")
    Path fleet;

    @Option(names = "--name", paramLabel = "NAME", description = "the recording's name in its header (default: the file name)")
    String name;

    @Option(names = "--synthesize", description = "write a synthetic recording and its fleet file instead of exporting the journal")
    boolean synthesize;

    @Option(names = "--clusters", defaultValue = "2000", paramLabel = "N", description = "synthetic fleet size (default: ${DEFAULT-VALUE})")
    int syntheticClusters;

    @Option(names = "--days", defaultValue = "7", paramLabel = "D", description = "synthetic days (default: ${DEFAULT-VALUE})")
    int days;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "S", description = "seed of the synthetic recording (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--out", paramLabel = "FILE", required = true, description = "the recording to write")
    Path out;

    @Override
    public Integer call() throws IOException {
        if (synthesize) return synthesize();
        if (from == null || until == null) {
            throw new InvalidInputException(Problem.at("tend record", 0, 0, from == null ? "--from" : "--until",
                    "exporting the journal needs --from T and --until T (or --synthesize for a synthetic recording)"));
        }
        Clock clock = Clock.systemDefaultZone();
        Instant start = TimeArg.parse("--from", from, clock);
        Instant end = TimeArg.parse("--until", until, clock);
        if (!end.isAfter(start)) {
            throw new InvalidInputException(Problem.at("tend record", 0, 0, "--until", "--until (" + end + ") must be after --from (" + start + ")"));
        }
        Set<String> only = clusters == null ? Set.of() : new LinkedHashSet<>(clusters);
        long[] counts = new long[2];
        Path dir = out.toAbsolutePath().getParent();
        if (dir != null) Files.createDirectories(dir);
        StoreAddress address = db.address();
        try (Store store = address.openExisting();
             BufferedWriter w = Files.newBufferedWriter(out, StandardCharsets.UTF_8)) {
            WireWriter writer = WireWriter.to(w);
            RecordingHeader header = RecordingHeader.of(name != null ? name : baseName(out)).withPeriod(start, end)
                    .withDescription("exported from the input journal of " + (address.isPostgres() ? address.url() : address.file().getFileName().toString())
                            + (only.isEmpty() ? "" : " for " + String.join(", ", only)));
            if (fleet != null) header = header.withFleet(relative(fleet));
            writer.writeHeader(header);
            WireReader reader = WireReader.trusted(address.toString());
            store.read(r -> {
                r.forEachTransitionInput(start, end, only, row -> export(row, reader, w, counts));
                return null;
            });
            writer.flush();
        }
        spec.commandLine().getErr().println("tend: wrote " + counts[0] + " events to " + out + " (" + counts[1]
                + " clear transitions reported by simulated actions left out: a replay simulates them again)");
        return ExitCodes.OK;
    }

    /** Writes the journal row as it was taken, unless it is a clear the live driver made up for a simulated action. */
    private static void export(InputRow row, WireReader reader, BufferedWriter w, long[] counts) {
        LineResult r = reader.parseLine(row.payload(), row.seq());
        if (!(r instanceof LineResult.Event e)) {
            throw new TendException("journal entry " + row.seq() + " holds an unreadable " + row.kind() + ": " + r);
        }
        if (e.event() instanceof HealthTransition t && "simulated".equals(t.extra().get("origin"))) {
            counts[1]++;
            return;
        }
        try {
            w.write(row.payload());
            w.write('\n');
        } catch (IOException ex) {
            throw new TendException("cannot write the recording: " + ex.getMessage(), ex);
        }
        counts[0]++;
    }

    private Integer synthesize() {
        Synthesizer.Result r = Synthesizer.write(new Synthesizer.Options(syntheticClusters, days, seed, Synthesizer.DEFAULT_START), out);
        spec.commandLine().getErr().println("tend: wrote " + r.events() + " synthetic events to " + r.recording() + " and its fleet to "
                + r.fleet() + " (" + Synthesizer.DEFAULT_START + " for " + days + (days == 1 ? " day" : " days") + ")");
        return ExitCodes.OK;
    }

    private String relative(Path fleetFile) {
        Path dir = out.toAbsolutePath().getParent();
        Path f = fleetFile.toAbsolutePath().normalize();
        return dir == null ? f.toString() : dir.normalize().relativize(f).toString();
    }

    private static String baseName(Path file) {
        String n = file.getFileName().toString();
        int dot = n.lastIndexOf('.');
        return dot > 0 ? n.substring(0, dot) : n;
    }
}
