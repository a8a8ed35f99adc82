package dev.tend.cli;

import dev.tend.simulator.Recording;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class RecordCommandTest {
    @TempDir
    Path dir;

    @Test
    void synthesizeWritesTheRecordingAndItsFleetBesideItAndTheReplayFindsTheFleetByTheHeader() {
        Path out = dir.resolve("week/small.jsonl");
        CliRun r = CliRun.of("record", "--synthesize", "--clusters", "30", "--days", "1", "--seed", "3", "--out", out.toString());
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.err()).contains("synthetic events to " + out).contains("small.fleet.yaml");
        assertThat(Files.exists(dir.resolve("week/small.fleet.yaml"))).isTrue();
        assertThat(Recording.open(out).header().orElseThrow().fleet()).isEqualTo("small.fleet.yaml");

        CliRun replay = CliRun.of("replay", out.toString(), "--playbooks", CliRun.root().resolve("playbooks/library").toString());
        assertThat(replay.exit()).as(replay.err()).isZero();
        assertThat(replay.out()).contains("fleet larkspur-synthetic (30 clusters)");
    }

    @Test
    void exportingTheJournalNeedsFromAndUntil() {
        CliRun r = CliRun.of("record", "--db", dir.resolve("tend.db").toString(), "--out", dir.resolve("x.jsonl").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("exporting the journal needs --from T and --until T (or --synthesize for a synthetic recording)");
    }

    @Test
    void exportingFromAStoreThatDoesNotExistSaysSo() {
        CliRun r = CliRun.of("record", "--db", dir.resolve("none.db").toString(), "--from", "2027-03-16T00:00:00Z",
                "--until", "2027-03-16T06:00:00Z", "--out", dir.resolve("x.jsonl").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("none.db: no such store");
    }

    @Test
    void untilMustBeAfterFrom() {
        CliRun r = CliRun.of("record", "--db", dir.resolve("tend.db").toString(), "--from", "2027-03-16T06:00:00Z",
                "--until", "2027-03-16T00:00:00Z", "--out", dir.resolve("x.jsonl").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("--until (2027-03-16T00:00:00Z) must be after --from (2027-03-16T06:00:00Z)");
    }

    @Test
    void exportsOnlyTheClustersAskedForWithAHeaderNamingThePeriodAndTheFleet() throws Exception {
        Path root = CliRun.root();
        String db = dir.resolve("tend.db").toString();
        CliRun ingest = CliRun.of("ingest", root.resolve("examples/silent-node.jsonl").toString(),
                "--playbooks", root.resolve("playbooks/library").toString(),
                "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--db", db, "--speedup", "100000");
        assertThat(ingest.exit()).as(ingest.err()).isZero();
        Path out = dir.resolve("only.jsonl");
        CliRun r = CliRun.of("record", "--db", db, "--from", "2026-03-14T00:00:00Z", "--until", "2026-03-15T00:00:00Z",
                "--cluster", "fares-17", "--fleet", root.resolve("playbooks/library/fleet.yaml").toString(), "--out", out.toString());
        assertThat(r.exit()).as(r.err()).isZero();
        Recording rec = Recording.open(out);
        assertThat(rec.header().orElseThrow().from()).isEqualTo(java.time.Instant.parse("2026-03-14T00:00:00Z"));
        assertThat(rec.headerFleet()).isPresent();
        long[] others = {0, 0};
        rec.read((e, line) -> {
            others[0]++;
            if (!e.cluster().value().equals("fares-17")) others[1]++;
        });
        assertThat(others[0]).isPositive();
        assertThat(others[1]).isZero();
    }
}
