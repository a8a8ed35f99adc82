package dev.tend.simulator;

import dev.tend.shared.wire.CountingInput;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.shared.CanonicalEvents;
import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.wire.LineResult;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.shared.wire.RecordingHeader;
import dev.tend.shared.wire.WireReader;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Collection;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * A recording on disk (DESIGN.md section 3): an optional header line, then health
 * transitions and topology events, read in file order (not sorted: a replay feeds them as
 * they were recorded, late arrivals included). A bad line is handed to the sink as a
 * located problem and skipped; it never stops the reading.
 *
 * <p>Opening reads only up to the first line that is not blank, to learn the header; each
 * {@link #read} streams the file again from its start, so a recording of millions of events
 * is never held in memory. Immutable; reads may run on any thread, one sink each.
 */
public final class Recording {
    private static final ObjectMapper JSON = new ObjectMapper();

    private final Path file;
    private final RecordingHeader header;
    private final long size;
    private final Collection<Id> signals;

    private Recording(Path file, RecordingHeader header, long size, Collection<Id> signals) {
        this.file = file;
        this.header = header;
        this.size = size;
        this.signals = List.copyOf(signals);
    }

    /**
     * A copy whose {@link #read} refuses transitions of a signal not in {@code declared}
     * (tend.yaml {@code signals:}); empty accepts every signal.
     */
    public Recording withDeclaredSignals(Collection<Id> declared) {
        return new Recording(file, header, size, declared);
    }

    /** Receives what {@link #read} finds, in file order. */
    public interface Sink {
        /** A transition or topology event at 1-based line {@code line}. */
        void event(WireEvent event, long line);

        /** A line that was rejected and skipped, located as FILE:LINE:COL. */
        default void problem(Problem problem) {
        }

        /** How many bytes of the file have been read so far; called now and then, for progress. */
        default void progress(long bytesRead) {
        }

        /**
         * The canonical ids to hand on ({@link WireReader#withIds}), or null (the default) for
         * the reader's own instances.
         */
        default CanonicalEvents ids() {
            return null;
        }
    }

    /**
     * Opens {@code file} and reads its header, if its first non-blank line is one.
     *
     * @throws InvalidInputException when the file does not exist or cannot be read
     */
    public static Recording open(Path file) {
        Objects.requireNonNull(file, "file");
        // lenient decoding here: a line that is not UTF-8 is only looked at, and read() refuses it by number
        try (BufferedReader in = new BufferedReader(new InputStreamReader(Files.newInputStream(file), StandardCharsets.UTF_8))) {
            WireReader reader = WireReader.of(file.toString());
            RecordingHeader header = null;
            String line;
            long n = 0;
            while ((line = in.readLine()) != null) {
                n++;
                if (n == 1 && !line.isEmpty() && line.charAt(0) == '\uFEFF') line = line.substring(1);
                if (line.isBlank()) continue;
                if (reader.parseLine(line, n) instanceof LineResult.Header h) header = h.header();
                break;
            }
            return new Recording(file, header, Files.size(file), List.of());
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "no such recording"));
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "cannot read the recording: " + e.getMessage()));
        }
    }

    public Path file() {
        return file;
    }

    /** The header, when the first non-blank line is a valid one. */
    public Optional<RecordingHeader> header() {
        return Optional.ofNullable(header);
    }

    /** The header's name, else the file name. */
    public String name() {
        return header != null ? header.name() : file.getFileName().toString();
    }

    /** The file's size in bytes when it was opened. */
    public long size() {
        return size;
    }

    /** {@code path} as the header means it: relative to the recording's folder. */
    public Path resolve(String path) {
        Path p = Path.of(path);
        if (p.isAbsolute()) return p;
        Path dir = file.toAbsolutePath().getParent();
        return dir == null ? p : dir.resolve(p).normalize();
    }

    /**
     * The fleet the header names (a path, relative to the recording, or inline), if it
     * names one.
     *
     * @throws InvalidInputException when the named fleet cannot be read or is invalid
     */
    public Optional<Fleet> headerFleet() {
        if (header == null) return Optional.empty();
        if (header.hasInlineFleet()) {
            try {
                return Optional.of(FleetFile.parse(file + " (inline fleet of the header)", JSON.writeValueAsString(header.inlineFleet())));
            } catch (JsonProcessingException e) {
                throw new InvalidInputException(Problem.at(file.toString(), 1, 0, "fleet", "the inline fleet cannot be read: " + e.getOriginalMessage()));
            }
        }
        if (header.fleet() == null) return Optional.empty();
        Path fleet = resolve(header.fleet());
        if (!Files.isRegularFile(fleet)) {
            throw new InvalidInputException(Problem.at(file.toString(), 1, 0, "fleet", "the header names the fleet file '"
                    + header.fleet() + "', but there is no file at " + fleet + "; pass --fleet FILE"));
        }
        return Optional.of(FleetFile.load(fleet));
    }

    /**
     * Streams every event to {@code sink} in file order; bad lines go to
     * {@link Sink#problem} and are skipped.
     *
     * @return the counts of the pass
     * @throws InvalidInputException when the file cannot be read
     * @throws RuntimeException whatever the sink throws, which stops the reading
     */
    public ReadSummary read(Sink sink) {
        Objects.requireNonNull(sink, "sink");
        try (CountingInput counted = new CountingInput(Files.newInputStream(file))) {
            long[] lastReported = {0};
            WireReader reader = WireReader.of(file.toString()).withSignals(signals);
            CanonicalEvents ids = sink.ids();
            if (ids != null) reader = reader.withIds(ids);
            return reader.readAll(counted, r -> {
                if (r instanceof LineResult.Event e) sink.event(e.event(), e.line());
                else if (r instanceof LineResult.Bad b) sink.problem(b.problem());
                if (counted.count() - lastReported[0] >= 1 << 20) {
                    lastReported[0] = counted.count();
                    sink.progress(counted.count());
                }
            });
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "no such recording"));
        } catch (IOException e) {
            throw new InvalidInputException(Problem.at(file.toString(), 0, 0, "", "cannot read the recording: " + e.getMessage()));
        }
    }
}
