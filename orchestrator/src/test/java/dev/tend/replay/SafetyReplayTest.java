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

    @Test
    void aTriggerThatClearsDuringTheFirstStepStandsTheRunDownBeforeTheSecondAndRunsOnStandDownInAReplay() {
        ReplayFiles files = new ReplayFiles(dir);
        String actions = ReplayFiles.ACTIONS + "  undrain-node: { simulated: { duration: 1m, success: 1.0 } }\n";
        String playbook = ReplayFiles.replacePlaybook("5m").replace("on-failure:",
                "on-stand-down:\n  - { id: undrain, action: undrain-node, timeout: 10m }\non-failure:");
        Path playbooks = files.playbooks("library", actions, playbook);
        List<String> lines = new ArrayList<>();
        for (int m = 0; m <= 5; m++) lines.add(minute(m, "tickets-12", "n2", "heartbeat", "silent"));
        // the drain starts at 5m and takes a minute; the node reports again at 5m30s
        lines.add(ReplayFiles.event(Duration.ofSeconds(330), "tickets-12", "n2", "heartbeat", "clear"));
        ReplayReport r = ReplayFiles.replay(playbooks, files.recording("back-by-itself", T0.plus(Duration.ofHours(1)), lines), 1);
        assertThat(r.summary().runsStoodDown()).isEqualTo(1);
        assertThat(r.runs()).singleElement().satisfies(run -> {
            assertThat(run.outcome()).isEqualTo("stood-down");
            assertThat(run.detail()).startsWith("stood down (cleared): ");
            assertThat(run.steps()).extracting(st -> st.step() + " " + st.state()).containsExactly("drain succeeded", "undrain succeeded");
        });
        var json = readJson(dev.tend.simulator.report.ReportJson.toJson(r));
        assertThat(json.get("summary").get("runs_stood_down").asLong()).isEqualTo(1);
        assertThat(json.get("runs").get(0).get("outcome").asText()).isEqualTo("stood-down");
    }

    private static com.fasterxml.jackson.databind.JsonNode readJson(String text) {
        try {
            return new com.fasterxml.jackson.databind.ObjectMapper().readTree(text);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void aMaskThatLiftsRestartsConfirmationInAReplay() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.RESTART);
        List<String> lines = new ArrayList<>();
        lines.add(minute(0, "tickets-12", "n1", "storage-full", "breach"));
        for (int m = 0; m <= 20; m++) lines.add(minute(m, "tickets-12", "n1", "process-down", "breach"));
        lines.add(minute(10, "tickets-12", "n1", "storage-full", "clear"));
        lines.sort(java.util.Comparator.comparing(l -> l.substring(7, 27)));
        ReplayReport r = ReplayFiles.replay(playbooks, files.recording("owner-fix", T0.plus(Duration.ofHours(1)), lines), 1);
        // confirm-for: 2m counts from the lift at 10m, not from the onset at 0m
        assertThat(r.runs()).singleElement().satisfies(run -> assertThat(run.startedAt()).isEqualTo(T0.plus(Duration.ofMinutes(12))));
    }
}
