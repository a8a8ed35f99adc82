package dev.tend.cli;

import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.LedgerKind;
import dev.tend.shared.TendException;
import dev.tend.store.InputRow;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.Callable;

/** {@code tend journal archive}: moves journal rows a snapshot covers out of the store. */
@Command(name = "journal", mixinStandardHelpOptions = true, subcommands = JournalCommand.Archive.class,
        description = "Look after the input journal (the ledger is never cut).")
public final class JournalCommand extends CommandGroup {

    @Command(name = "archive", mixinStandardHelpOptions = true,
            description = "Move the journal's inputs taken before T, and covered by the newest snapshot, to FILE (JSON Lines, "
                    + "one row each) and delete them from the store; the ledger keeps every entry.")
    public static final class Archive implements Callable<Integer> {
        private static final ObjectMapper JSON = new ObjectMapper().disable(JsonGenerator.Feature.AUTO_CLOSE_TARGET);

        @Spec
        CommandSpec spec;

        @Mixin
        DbOption db;

        @Option(names = "--before", required = true, paramLabel = "T",
                description = "archive inputs taken before T (RFC 3339, a clock time like 22:00, or a duration ago like 30d)")
        String before;

        @Option(names = "--to", required = true, paramLabel = "FILE",
                description = "the archive file (JSON Lines); created, or appended to when it exists")
        Path to;

        @Override
        public Integer call() {
            Clock clock = Clock.systemUTC();
            Instant until = TimeArg.parse("--before", before, clock);
            long keptBytes = sizeOf(to);
            try (Store store = db.openExisting()) {
                SnapshotRow snapshot = store.read(StoreReader::latestSnapshot).orElseThrow(() -> new TendException("the store at "
                        + store.location() + " has no snapshot yet, so every input is still needed to start: run `tend serve` or "
                        + "`tend ingest` on it first (they write a snapshot every --snapshot-every inputs and at a clean stop)"));
                long[] moved = {0, Long.MAX_VALUE, 0};
                try {
                    store.useTransaction(tx -> {
                        long last = tx.lastInputSeq();
                        try (FileChannel ch = FileChannel.open(to, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                                StandardOpenOption.APPEND);
                             OutputStream out = Channels.newOutputStream(ch)) {
                            tx.forEachInput(0, row -> {
                                if (row.seq() > snapshot.seq() || row.seq() >= last || !row.now().isBefore(until)) return;
                                write(out, row);
                                moved[0]++;
                                moved[1] = Math.min(moved[1], row.seq());
                                moved[2] = Math.max(moved[2], row.seq());
                            });
                            out.flush();
                            ch.force(true); // on disk before the rows leave the store
                        } catch (IOException e) {
                            throw new UncheckedIOException(e);
                        }
                        long deleted = tx.deleteInputs(snapshot.seq(), until);
                        if (deleted != moved[0]) {
                            throw new TendException("archiving wrote " + moved[0] + " inputs but would delete " + deleted
                                    + "; nothing was deleted");
                        }
                        Map<String, Object> fields = new LinkedHashMap<>();
                        fields.put("inputs", moved[0]);
                        if (moved[0] > 0) {
                            fields.put("first_seq", moved[1]);
                            fields.put("last_seq", moved[2]);
                        }
                        fields.put("before", until.toString());
                        fields.put("snapshot_seq", snapshot.seq());
                        fields.put("to", to.toAbsolutePath().toString());
                        tx.appendLedger(clock.instant(), LedgerKind.JOURNAL_ARCHIVED.wire(), LedgerKind.JOURNAL_ARCHIVED.check(fields));
                    });
                } catch (RuntimeException e) {
                    truncateQuietly(to, keptBytes);
                    if (e instanceof UncheckedIOException io) {
                        throw new TendException("--to " + to + ": cannot write the archive (" + io.getCause().getMessage()
                                + "); nothing was deleted", io);
                    }
                    throw e;
                }
                spec.commandLine().getOut().println("archived " + moved[0] + " journal inputs"
                        + (moved[0] > 0 ? " (seq " + moved[1] + " to " + moved[2] + ")" : "") + " to " + to
                        + "; the newest snapshot (journal seq " + snapshot.seq() + ") covers them, and the ledger keeps every entry");
                return ExitCodes.OK;
            }
        }

        private static void write(OutputStream out, InputRow row) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("seq", row.seq());
            m.put("kind", row.kind());
            m.put("now", row.now().toString());
            m.put("event_at", row.eventAt() == null ? null : row.eventAt().toString());
            m.put("cluster", row.cluster());
            m.put("payload", row.payload());
            try {
                JSON.writeValue(out, m);
                out.write('\n');
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }

        private static long sizeOf(Path file) {
            try {
                return Files.exists(file) ? Files.size(file) : -1;
            } catch (IOException e) {
                throw new TendException("--to " + file + ": cannot read it (" + e.getMessage() + ")");
            }
        }

        /** Takes back what a failed archive appended: the file as it was, or no file when there was none. */
        private static void truncateQuietly(Path file, long size) {
            try {
                if (size < 0) {
                    Files.deleteIfExists(file);
                } else {
                    try (FileChannel ch = FileChannel.open(file, StandardOpenOption.WRITE)) {
                        ch.truncate(size);
                    }
                }
            } catch (IOException ignored) {
                // the archive was not complete; a person sees the error above either way
            }
        }
    }
}
