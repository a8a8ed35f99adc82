package dev.tend.replay;

import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.HiddenMask;
import dev.tend.simulator.report.ReplayReport;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.replay.ReplayFiles.T0;
import static dev.tend.replay.ReplayFiles.minute;
import static org.assertj.core.api.Assertions.assertThat;

class CounterfactualMaskingTest {
    @TempDir
    Path dir;

    /**
     * tickets-12/n2 is silent for two hours in the recording (nobody fixed it), reported again
     * every minute, then clear at minute 120; silent again at 130 for ten minutes. In the
     * replay the playbook confirms at minute 5, drains for 1m and replaces for 2m: the
     * replacement clears the heartbeat at minute 8.
     */
    private ReplayReport replayTwoSilentHours() {
        ReplayFiles files = new ReplayFiles(dir);
        Path playbooks = files.playbooks("library", ReplayFiles.ACTIONS, ReplayFiles.replacePlaybook("5m"));
        List<String> lines = new ArrayList<>();
        for (int m = 0; m < 120; m++) lines.add(minute(m, "tickets-12", "n2", "heartbeat", "silent"));
        lines.add(minute(120, "tickets-12", "n2", "heartbeat", "clear"));
        lines.add(minute(130, "tickets-12", "n2", "heartbeat", "silent"));
        lines.add(minute(140, "tickets-12", "n2", "heartbeat", "clear"));
        Path rec = files.recording("two-silent-hours", T0.plus(Duration.ofHours(3)), lines);
        return ReplayFiles.replay(playbooks, rec, 1);
    }

    @Test
    void laterSilentEventsAreHiddenAndExactlyOneRunIsReported() {
        ReplayReport r = replayTwoSilentHours();
        assertThat(r.runs()).singleElement().satisfies(run -> {
            assertThat(run.target()).isEqualTo("tickets-12/n2");
            assertThat(run.startedAt()).isEqualTo(T0.plus(Duration.ofMinutes(5)));
            assertThat(run.endedAt()).isEqualTo(T0.plus(Duration.ofMinutes(8)));
            assertThat(run.outcome()).isEqualTo("succeeded");
        });
        // the simulated clear at minute 8 comes before the recorded event of minute 8; minutes 8 to 119 are hidden
        assertThat(r.summary().hiddenEvents()).isEqualTo(112);
        HiddenMask mask = r.masks().get(0);
        assertThat(r.masks()).hasSize(1);
        assertThat(mask.hiddenEvents()).isEqualTo(112);
        assertThat(mask.maskedAt()).isEqualTo(T0.plus(Duration.ofMinutes(8)));
        assertThat(mask.liftedAt()).isEqualTo(T0.plus(Duration.ofMinutes(120)));
        assertThat(mask.run()).isEqualTo(r.runs().get(0).run());
        assertThat(mask.action()).isEqualTo("replace-node");
        assertThat(mask.reason()).contains("was cleared by run r000001 (replace-node)");
    }

    @Test
    void afterTheRecordingShowsTheSignalClearANewProblemCountsAgain() {
        ReplayReport r = replayTwoSilentHours();
        List<DecisionEntry> later = r.decisions().stream().filter(d -> !d.at().isBefore(T0.plus(Duration.ofMinutes(130)))).toList();
        assertThat(later).extracting(DecisionEntry::verdict).first().isEqualTo(Verdict.HOLD);
        assertThat(later.get(0).reasons()).contains(ReasonCode.UNCONFIRMED);
        // confirmed at minute 135, but the target was replaced two hours ago: the cooldown holds it
        assertThat(later).anySatisfy(d -> assertThat(d.reasons()).contains(ReasonCode.COOLDOWN));
        assertThat(r.summary().runsStarted()).isEqualTo(1);
    }
}
