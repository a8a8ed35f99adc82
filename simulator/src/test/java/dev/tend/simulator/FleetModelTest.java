package dev.tend.simulator;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.simulator.report.HiddenMask;
import org.junit.jupiter.api.Test;

import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

class FleetModelTest {
    private static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");
    private static final SignalKey HEARTBEAT = new SignalKey(Id.of("tickets-12"), Id.of("n2"), Id.of("heartbeat"));

    private static HealthTransition at(int minute, String node, String signal, SignalState s) {
        return HealthTransition.of(T0.plusSeconds(60L * minute), "tickets-12", node, signal, s);
    }

    @Test
    void letsEverythingThroughWhileNothingIsMasked() {
        FleetModel m = new FleetModel();
        assertThat(m.admits(at(0, "n2", "heartbeat", SignalState.SILENT))).isTrue();
        assertThat(m.hiddenEvents()).isZero();
        assertThat(m.masks()).isEmpty();
    }

    @Test
    void hidesRecordedProblemsOfAClearedSignalUntilTheRecordingShowsItClear() {
        FleetModel m = new FleetModel();
        m.mask(HEARTBEAT, T0.plusSeconds(600), "r000001", "replace-node");
        assertThat(m.admits(at(11, "n2", "heartbeat", SignalState.SILENT))).isFalse();
        assertThat(m.admits(at(12, "n2", "heartbeat", SignalState.BREACH))).isFalse();
        assertThat(m.isMasked(HEARTBEAT)).isTrue();
        assertThat(m.admits(at(30, "n2", "heartbeat", SignalState.CLEAR))).isTrue();
        assertThat(m.isMasked(HEARTBEAT)).isFalse();
        assertThat(m.admits(at(40, "n2", "heartbeat", SignalState.SILENT))).as("a new problem counts again").isTrue();
        assertThat(m.hiddenEvents()).isEqualTo(2);
        HiddenMask mask = m.masks().get(0);
        assertThat(mask.hiddenEvents()).isEqualTo(2);
        assertThat(mask.liftedAt()).isEqualTo(T0.plusSeconds(1800));
        assertThat(mask.reason()).isEqualTo("heartbeat on tickets-12/n2 was cleared by run r000001 (replace-node) in the replay;"
                + " the recording still showed it until 2027-03-14T02:30:00Z");
    }

    @Test
    void masksOnlyTheClearedSignalOnTheClearedNode() {
        FleetModel m = new FleetModel();
        m.mask(HEARTBEAT, T0, "r000001", "replace-node");
        assertThat(m.admits(at(1, "n1", "heartbeat", SignalState.SILENT))).isTrue();
        assertThat(m.admits(at(1, "n2", "process-down", SignalState.BREACH))).isTrue();
        assertThat(m.hiddenEvents()).isZero();
    }

    @Test
    void aSecondClearOfAMaskedSignalKeepsTheFirstMask() {
        FleetModel m = new FleetModel();
        m.mask(HEARTBEAT, T0, "r000001", "replace-node");
        m.mask(HEARTBEAT, T0.plusSeconds(60), "r000002", "replace-node");
        assertThat(m.masks()).singleElement().satisfies(x -> assertThat(x.run()).isEqualTo("r000001"));
    }

    @Test
    void aMaskTheRecordingNeverLiftsIsReportedUntilItsEnd() {
        FleetModel m = new FleetModel();
        m.mask(HEARTBEAT, T0, "r000001", "replace-node");
        m.admits(at(5, "n2", "heartbeat", SignalState.SILENT));
        assertThat(m.masks().get(0).liftedAt()).isNull();
        assertThat(m.masks().get(0).reason()).endsWith("until its end");
    }
}
