package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

class ReplayCommandTest {
    @TempDir
    Path dir;

    private static final Path ROOT = CliRun.root();
    private static final String LIBRARY = ROOT.resolve("playbooks/library").toString();
    private static final String FLEET = ROOT.resolve("playbooks/library/fleet.yaml").toString();

    private static String recording(String name) {
        return ROOT.resolve("simulator/recordings/" + name + ".jsonl").toString();
    }

    @Test
    void theZoneOutageInTextTellsWhatWouldHaveHappenedInAScreenful() {
        CliRun r = CliRun.of("replay", recording("zone-outage"), "--playbooks", LIBRARY, "--fleet", FLEET, "--format", "text");
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).contains("replay of zone-outage").contains("runs started       0").contains("fleet brake        engaged 1 time")
                .contains("holds by reason").contains("fleet-brake").contains("notifications: 1 (oncall 1)");
        // "0 approvals requested" beside approval-required holds is explained, and each reason names targets
        assertThat(r.out()).containsPattern("approval-required +\\d+  the playbook asks a person for this cluster\n.*\n +0 approvals requested: these"
                        + " decisions were also held by another guard, and a person is asked only once approval is the last reason left")
                .containsPattern("fleet-brake +\\d+  the fleet brake is engaged\n +[a-z]+-\\d+(/n\\d+)?, [a-z]+-\\d+(/n\\d+)?,"
                        + " [a-z]+-\\d+(/n\\d+)? and \\d+ more \\(\\d+ targets\\)");
        assertThat(r.out().lines().count()).isLessThan(50);
        assertThat(r.err()).as("no bar when standard error is not a terminal: at most plain progress lines")
                .doesNotContain("\r").doesNotContain("[");
        assertThat(r.err().lines()).allMatch(l -> l.startsWith("tend: replaying zone-outage.jsonl: "));
    }

    @Test
    void theJsonReportHasEveryContractField() throws Exception {
        CliRun r = CliRun.of("replay", recording("quiet-night"), "--playbooks", LIBRARY, "--format", "json");
        assertThat(r.exit()).as(r.err()).isZero();
        JsonNode j = new ObjectMapper().readTree(r.out());
        // DESIGN.md section 7, the JSON report contract
        assertThat(j.get("summary")).isNotNull();
        for (String f : List.of("runs_started", "runs_succeeded", "runs_failed", "held", "denied", "approvals_requested",
                "max_concurrent_runs", "brake_engaged")) {
            assertThat(j.get("summary").has(f)).as("summary." + f).isTrue();
        }
        assertThat(j.get("runs")).hasSize(2);
        for (JsonNode run : j.get("runs")) {
            for (String f : List.of("run", "playbook", "cluster", "node", "started_at", "ended_at", "outcome", "steps")) {
                assertThat(run.has(f)).as("runs[]." + f).isTrue();
            }
            assertThat(run.get("steps").isArray()).isTrue();
        }
        assertThat(j.get("decisions")).isNotEmpty();
        for (JsonNode d : j.get("decisions")) {
            for (String f : List.of("at", "playbook", "cluster", "node", "verdict", "reasons")) {
                assertThat(d.has(f)).as("decisions[]." + f).isTrue();
            }
            assertThat(d.get("reasons").isArray()).isTrue();
        }
    }

    @Test
    void theHtmlReportIsWrittenToTheOutFile() throws Exception {
        Path out = dir.resolve("reports/r.html");
        CliRun r = CliRun.of("replay", recording("zone-outage"), "--playbooks", LIBRARY, "--format", "html", "--out", out.toString());
        assertThat(r.exit()).as(r.err()).isZero();
        assertThat(r.out()).isEmpty();
        assertThat(r.err()).contains("report written to " + out);
        assertThat(Files.readString(out)).startsWith("<!DOCTYPE html>").contains("<svg").contains("Fleet brake");
    }

    @Test
    void aLongerConfirmForInTheOtherSetIsListedAsARunStartedOnlyInA() throws Exception {
        Path b = dir.resolve("longer-confirm");
        Files.createDirectories(b);
        try (Stream<Path> files = Files.list(ROOT.resolve("playbooks/library"))) {
            for (Path p : files.toList()) {
                if (p.getFileName().toString().endsWith(".yaml")) Files.copy(p, b.resolve(p.getFileName()));
            }
        }
        Path replace = b.resolve("replace-silent-node.yaml");
        Files.writeString(replace, Files.readString(replace).replace("confirm-for: 5m", "confirm-for: 30m"));
        // tickets-12/n2 is silent for ten minutes: long enough for 5m, not for 30m
        List<String> lines = new ArrayList<>();
        lines.add("{\"recording\":\"ten-silent-minutes\",\"fleet\":\"" + FLEET + "\"}");
        for (int m = 0; m < 10; m++) {
            lines.add("{\"at\":\"2027-03-16T01:" + String.format("%02d", m) + ":00Z\",\"cluster\":\"tickets-12\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}");
        }
        lines.add("{\"at\":\"2027-03-16T01:10:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"clear\"}");
        Path rec = dir.resolve("ten.jsonl");
        Files.writeString(rec, String.join("\n", lines) + "\n");

        CliRun text = CliRun.of("replay", rec.toString(), "--playbooks", LIBRARY, "--against", b.toString());
        assertThat(text.exit()).as("differences are findings").isEqualTo(ExitCodes.FINDINGS);
        assertThat(text.out()).contains("started only in A: replace-silent-node on tickets-12/n2").contains("runs started").doesNotContain("runs_started");

        CliRun json = CliRun.of("replay", rec.toString(), "--playbooks", LIBRARY, "--against", b.toString(), "--format", "json");
        JsonNode j = new ObjectMapper().readTree(json.out());
        assertThat(j.get("runs").get(0).get("kind").asText()).isEqualTo("only-in-a");
        assertThat(j.get("summary").get("runs_started").get("delta").asInt()).isEqualTo(-1);
        assertThat(j.get("same").asBoolean()).isFalse();

        CliRun same = CliRun.of("replay", rec.toString(), "--playbooks", LIBRARY, "--against", LIBRARY);
        assertThat(same.exit()).isZero();
        assertThat(same.out()).contains("no differences");
    }

    @Test
    void aRecordingWhoseHeaderNamesNoFleetNeedsFleetAndSaysSo() throws Exception {
        Path rec = dir.resolve("bare.jsonl");
        Files.writeString(rec, "{\"at\":\"2027-03-16T01:00:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}\n");
        CliRun r = CliRun.of("replay", rec.toString(), "--playbooks", LIBRARY);
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains(rec + ": the recording's header names no fleet file, and no --fleet was given: pass --fleet FILE");
    }

    @Test
    void badLinesAreReportedLocatedAndSkippedAndTheReplayGoesOn() throws Exception {
        Path rec = dir.resolve("bad.jsonl");
        Files.writeString(rec, String.join("\n",
                "{\"recording\":\"bad\",\"fleet\":\"" + FLEET + "\"}",
                "{\"at\":\"2027-03-16T01:00:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"down\"}",
                "{\"at\":\"2027-03-16T01:00:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}") + "\n");
        CliRun r = CliRun.of("replay", rec.toString(), "--playbooks", LIBRARY);
        assertThat(r.exit()).isEqualTo(ExitCodes.FINDINGS);
        assertThat(r.err()).contains(rec + ":2:").contains("field 'state' must be breach, silent or clear, got 'down' (line skipped)");
        assertThat(r.out()).contains("1 events (1 bad lines skipped").contains("runs started       1");
    }

    @Test
    void anActionsFileReplacesActionDefinitionsForTheReplay() throws Exception {
        Path actions = dir.resolve("slow-actions.yaml");
        Files.writeString(actions, "actions:\n  replace-node: { simulated: { duration: 5m, success: 0.0 } }\n");
        CliRun r = CliRun.of("replay", recording("quiet-night"), "--playbooks", LIBRARY, "--actions", actions.toString(), "--format", "json");
        assertThat(r.exit()).as(r.err()).isZero();
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertThat(j.get("summary").get("runs_failed").asInt()).isEqualTo(2);
        assertThat(j.get("summary").get("runs_succeeded").asInt()).isZero();
    }

    @Test
    void aMissingPlaybookDirectoryIsAnInputError() {
        CliRun r = CliRun.of("replay", recording("quiet-night"), "--playbooks", dir.resolve("nope").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("nope: not a directory of playbooks");
    }
}
