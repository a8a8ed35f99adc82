package dev.tend.replay;

import dev.tend.shared.Verdict;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.StepEntry;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.replay.ReplayFiles.T0;
import static dev.tend.replay.ReplayFiles.minute;
import static org.assertj.core.api.Assertions.assertThat;

class ReplayBehaviourTest {
    @TempDir
    Path dir;

    private List<String> silentFor(String cluster, String node, int minutes) {
        List<String> lines = new ArrayList<>();
        for (int m = 0; m < minutes; m++) lines.add(minute(m, cluster, node, "heartbeat", "silent"));
        return lines;
    }

    @Test
    void approvalRequestsAreCountedAndLapseAtTheirExpiryWithoutARun() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        Path rec = files.recording("critical", T0.plus(Duration.ofHours(2)), silentFor("fares-3", "n2", 90));
        ReplayReport r = ReplayFiles.replay(playbooks, rec, 1);
        assertThat(r.summary().approvalsRequested()).isEqualTo(1);
        assertThat(r.runs()).isEmpty();
        assertThat(r.decisions()).anySatisfy(d -> assertThat(d.verdict()).isEqualTo(Verdict.AWAIT_APPROVAL));
        assertThat(r.assumptions()).anySatisfy(a -> assertThat(a).startsWith("no approval arrives in a replay"));
    }

    @Test
    void anActionThatCannotBeSimulatedIsTakenAsASuccessAfterOneMinuteAndTheReportSaysSo() {
        ReplayFiles files = new ReplayFiles(dir);
        String actions = """
                actions:
                  drain-node: { command: [/opt/larkspur/bin/drain, "{node}"], timeout: 5m }
                  replace-node: { simulated: { duration: 2m, success: 1.0, clears: [heartbeat] } }
                """;
        Path playbooks = files.playbooks("library", actions, ReplayFiles.replacePlaybook("5m"));
        Path rec = files.recording("command", null, silentFor("tickets-12", "n2", 30));
        ReplayReport r = ReplayFiles.replay(playbooks, rec, 1);
        assertThat(r.runs()).singleElement().satisfies(run -> {
            StepEntry drain = run.steps().get(0);
            assertThat(drain.state()).isEqualTo("succeeded");
            assertThat(Duration.between(drain.startedAt(), drain.endedAt())).isEqualTo(Duration.ofMinutes(1));
            assertThat(run.outcome()).isEqualTo("succeeded");
        });
        assertThat(r.assumptions()).contains("action drain-node (command) cannot be simulated: its one call was taken to succeed"
                + " after 1m and to clear nothing; give a simulated definition with --actions FILE to model it");
    }

    @Test
    void anEventOlderThanTheClockIsFedAtTheClocksTimeAndCountedLate() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        Path rec = files.recording("late", null, List.of(
                minute(10, "tickets-12", "n2", "heartbeat", "silent"),
                minute(4, "tickets-12", "n2", "heartbeat", "clear"),
                minute(12, "tickets-13", "n1", "cpu-high", "breach")));
        ReplayReport r = ReplayFiles.replay(playbooks, rec, 1);
        assertThat(r.recording().lateEvents()).isEqualTo(1);
        assertThat(r.recording().events()).isEqualTo(3);
        // the late clear changed nothing: the node stays silent and is replaced at minute 15
        assertThat(r.runs()).singleElement().satisfies(run -> assertThat(run.startedAt()).isEqualTo(T0.plus(Duration.ofMinutes(15))));
    }

    @Test
    void virtualTimeRunsOnTwoHoursPastTheLastEventWhenTheHeaderHasNoUntil() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        Path rec = files.recording("short", null, List.of(minute(0, "tickets-12", "n2", "heartbeat", "silent")));
        ReplayReport r = ReplayFiles.replay(playbooks, rec, 1);
        assertThat(r.recording().horizon()).isEqualTo(T0.plus(Duration.ofHours(2)));
        assertThat(r.runs()).singleElement().satisfies(run -> assertThat(run.outcome()).isEqualTo("succeeded"));
        assertThat(r.unhealthy()).isNotEmpty();
        assertThat(r.unhealthy().get(0).at()).isEqualTo(T0);
    }

    @Test
    void anActionOverrideReplacesTheDefinitionOfTheSameId() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        Path rec = files.recording("override", null, silentFor("tickets-12", "n2", 30));
        var set = ActionOverrides.apply(dev.tend.playbooks.load.PlaybookLoader.load(playbooks),
                dev.tend.playbooks.load.PlaybookLoader.parseActions("failing.yaml",
                        "actions:\n  replace-node: { simulated: { duration: 1m, success: 0.0 } }\n"));
        var recording = dev.tend.simulator.Recording.open(rec);
        ReplayReport r = Replayer.of(set, recording.headerFleet().orElseThrow(), 1).replay(recording);
        assertThat(r.runs()).singleElement().satisfies(run -> assertThat(run.outcome()).isEqualTo("failed"));
        assertThat(r.notifications()).anySatisfy(n -> assertThat(n.message()).startsWith("replacing n2 in tickets-12 failed at replace"));
        assertThat(r.replay().actionsSha256()).isNotEqualTo(dev.tend.playbooks.load.PlaybookLoader.load(playbooks).actions().contentHash());
    }
}
