package dev.tend.replay;

import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.ReportJson;
import dev.tend.simulator.report.RunEntry;
import dev.tend.simulator.synth.Synthesizer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class ReplayDeterminismTest {
    @TempDir
    Path dir;

    private static final Path LIBRARY = ReplayFiles.root().resolve("playbooks/library");

    @Test
    void twoReplaysWithTheSameSeedGiveByteIdenticalJson() throws Exception {
        Path rec = dir.resolve("day.jsonl");
        Synthesizer.write(Synthesizer.Options.of(120, 1, 4), rec);
        PlaybookSet policy = PlaybookLoader.load(LIBRARY);
        Recording recording = Recording.open(rec);
        String a = ReportJson.toJson(Replayer.of(policy, recording.headerFleet().orElseThrow(), 9).replay(recording));
        String b = ReportJson.toJson(Replayer.of(PlaybookLoader.load(LIBRARY), Recording.open(rec).headerFleet().orElseThrow(), 9)
                .replay(Recording.open(rec)));
        Files.writeString(dir.resolve("a.json"), a);
        Files.writeString(dir.resolve("b.json"), b);
        assertThat(Files.readAllBytes(dir.resolve("a.json"))).isEqualTo(Files.readAllBytes(dir.resolve("b.json")));
        assertThat(a).contains("\"runs_started\"");
    }

    /**
     * The quiet night with two seeds: the seed decides only simulated outcomes (how long each
     * action takes, whether it succeeds), so every decision and every run start is the same,
     * while the runs' steps differ.
     */
    @Test
    void aDifferentSeedChangesOnlySimulatedOutcomes() {
        Path rec = ReplayFiles.root().resolve("simulator/recordings/quiet-night.jsonl");
        ReplayReport one = replay(rec, 1);
        ReplayReport two = replay(rec, 2);
        assertThat(decisions(two)).isEqualTo(decisions(one));
        assertThat(starts(two)).isEqualTo(starts(one));
        assertThat(two.runs()).extracting(RunEntry::steps).isNotEqualTo(one.runs().stream().map(RunEntry::steps).toList());
        assertThat(ReportJson.toJson(two)).isNotEqualTo(ReportJson.toJson(one));
    }

    private static ReplayReport replay(Path rec, long seed) {
        Recording recording = Recording.open(rec);
        return Replayer.of(PlaybookLoader.load(LIBRARY), recording.headerFleet().orElseThrow(), seed).replay(recording);
    }

    private static List<String> decisions(ReplayReport r) {
        return r.decisions().stream().map(DecisionEntry::toString).toList();
    }

    private static List<String> starts(ReplayReport r) {
        return r.runs().stream().map(x -> x.run() + " " + x.playbook() + " " + x.target() + " " + x.startedAt()).toList();
    }
}
