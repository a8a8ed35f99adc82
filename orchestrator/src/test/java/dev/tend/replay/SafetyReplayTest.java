package dev.tend.replay;

import dev.tend.shared.ReasonCode;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.RunEntry;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.replay.ReplayFiles.T0;
import static dev.tend.replay.ReplayFiles.minute;
import static org.assertj.core.api.Assertions.assertThat;

/** The safety contract of DESIGN.md sections 3 and 4, through the replay path of {@code tend replay}. */
class SafetyReplayTest {
    @TempDir
    Path dir;

    private static void write(Path file, String text) {
        try {
            java.nio.file.Files.writeString(file, text);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void anUnknownNodeAndAnUnknownClusterAreDeniedUnknownTargetInAReplay() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.RESTART);
        List<String> lines = new ArrayList<>();
        for (int m = 0; m < 10; m++) {
            lines.add(minute(m, "tickets-12", "n9", "process-down", "breach"));
            lines.add(minute(m, "tickets-99", "n1", "process-down", "breach"));
        }
        ReplayReport r = ReplayFiles.replay(playbooks, files.recording("unknown", T0.plus(Duration.ofHours(1)), lines), 1);
        assertThat(r.runs()).isEmpty();
        assertThat(r.decisions()).extracting(d -> d.cluster().value() + "/" + d.node()).contains("tickets-12/n9", "tickets-99/n1");
        assertThat(r.decisions()).allSatisfy(d -> {
            assertThat(d.verdict().wireName()).isEqualTo("deny");
            assertThat(d.reasons().get(0)).as("first in guard order").isEqualTo(ReasonCode.UNKNOWN_TARGET);
        });
    }

    @Test
    void aFarFutureLineIsRefusedAndConfirmsNothing() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        List<String> lines = new ArrayList<>();
        lines.add(minute(0, "tickets-12", "n2", "heartbeat", "silent"));
        // one mistyped year: 2261 instead of 2026, on another cluster
        lines.add(minute(1, "tickets-13", "n1", "disk-latency", "breach").replace("\"at\":\"2027", "\"at\":\"2261"));
        lines.add(minute(2, "tickets-12", "n2", "heartbeat", "clear"));
        ReplayReport r = ReplayFiles.replay(playbooks, files.recording("typo", T0.plus(Duration.ofHours(1)), lines), 1);
        assertThat(r.recording().badLines()).isEqualTo(1);
        assertThat(r.runs()).isEmpty();
        assertThat(r.decisions()).extracting(DecisionEntry::reasons).containsExactly(List.of(ReasonCode.UNCONFIRMED));
    }

    @Test
    void twelveProblemsFiveMinutesApartUnderThreePerHourNeverStartMoreThanThreeInAnyRollingHourInAReplay() {
        ReplayFiles files = new ReplayFiles(dir);
        String restart = ReplayFiles.RESTART.replace("confirm-for: 2m }", "confirm-for: 0s }\nlimits: { rate: 3/1h, cooldown: 0s }");
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, restart);
        StringBuilder fleet = new StringBuilder("fleet: larkspur-test\nclusters:\n");
        for (int i = 1; i <= 12; i++) {
            fleet.append("  - { id: fares-").append(i).append(", nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }] }\n");
        }
        write(dir.resolve("fleet.yaml"), fleet.toString());
        List<String> lines = new ArrayList<>();
        for (int i = 0; i < 12; i++) lines.add(minute(5 * i, "fares-" + (i + 1), "n1", "process-down", "breach"));
        ReplayReport r = ReplayFiles.replay(playbooks, files.recording("twelve", T0.plus(Duration.ofHours(6)), lines), 1);
        List<Instant> starts = r.runs().stream().map(RunEntry::startedAt).sorted().toList();
        assertThat(starts).hasSize(12);
        assertThat(starts.stream().map(t -> Duration.between(T0, t).toMinutes()).toList())
                .containsExactly(0L, 5L, 10L, 60L, 65L, 70L, 120L, 125L, 130L, 180L, 185L, 190L);
        for (int i = 0; i + 3 < starts.size(); i++) {
            assertThat(Duration.between(starts.get(i), starts.get(i + 3))).as("starts %s", starts).isGreaterThanOrEqualTo(Duration.ofHours(1));
        }
    }
}
