package dev.tend.cli;

import dev.tend.store.RunFilter;
import dev.tend.store.RunRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ArchiveTrainingTest {
    private static final Path ROOT = CliRun.root();

    @Test
    void replaysTheRecordingReportsAHandoverAndIngestsOverTheFleet() throws Exception {
        int code = ArchiveTraining.train(new String[]{"replay", ROOT.resolve("simulator/recordings/zone-outage.jsonl").toString(),
                "--playbooks", ROOT.resolve("playbooks/library").toString()});
        assertThat(code).as("the first exit code of the replay, the handover and the ingest that is not 0").isZero();
    }

    @Test
    void passesOnAFailingFirstPartsExitCode() throws Exception {
        int code = ArchiveTraining.train(new String[]{"replay", ROOT.resolve("simulator/recordings/no-such-recording.jsonl").toString(),
                "--playbooks", ROOT.resolve("playbooks/library").toString()});
        assertThat(code).isNotZero();
    }

    @Test
    void theIngestPartTakesEveryLineAndStartsRunsOnTheBundledFleet(@TempDir Path dir) throws Exception {
        StringWriter said = new StringWriter();
        PrintWriter out = new PrintWriter(said);
        int code = ArchiveTraining.ingest(new String[]{"replay", "unused.jsonl", "--playbooks", ROOT.resolve("playbooks/library").toString()},
                dir, out);
        out.flush();
        assertThat(code).isZero();
        // every line taken (none refused for its time or its names): the archive holds the path of taken events.
        // A line may count as late (read, but older than an event already applied for its signal): the simulated
        // executor's own transitions for a restarted node race the file's lines, so how many is not asserted.
        assertThat(said.toString()).contains("read 3000 events (0 bad lines skipped, ");
        try (Store store = Store.openSqlite(dir.resolve("ingest.db"))) {
            List<RunRow> runs = store.read(r -> r.runs(RunFilter.all()));
            assertThat(runs).as("stopped processes confirmed and restarted: the run path is in the archive too").isNotEmpty();
        }
    }
}
