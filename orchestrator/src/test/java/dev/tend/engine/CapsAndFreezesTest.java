package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.time.Instant;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class CapsAndFreezesTest {
    private static final String FLEET = fleet(cluster("fares-1", "standard", 3, null) + cluster("fares-2", "standard", 3, null)
            + cluster("fares-3", "standard", 3, null) + cluster("fares-4", "standard", 3, null));

    @Test
    void heldBlastRadiusWhenTheZoneCapIsReachedAndStartedWhenAZoneRunEnds() {
        // n1 of every cluster is in zone z-a (EngineHarness.cluster spreads nodes over z-a, z-b, z-c)
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false, per-zone: 2, fleet: 10"));
        h.at(0, "fares-1", "n1", "heartbeat", SILENT);
        h.at(1, "fares-2", "n1", "heartbeat", SILENT);
        h.at(2, "fares-3", "n1", "heartbeat", SILENT);
        h.at(3, "fares-4", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-3")).containsExactly("hold [blast-radius]");
        assertThat((java.util.List<?>) h.lastVerdict("fares-3").get("messages")).anySatisfy(m -> assertThat(m.toString()).contains("zone z-a"));
        assertThat(h.verdicts("fares-4")).as("another zone is not capped").containsExactly("start []");
        h.settle();
        assertThat(h.verdicts("fares-3")).endsWith("start []");
    }

    @Test
    void heldBlastRadiusWhenTheFleetCapIsReached() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false, per-zone: 10, fleet: 2"));
        h.at(0, "fares-1", "n1", "heartbeat", SILENT);
        h.at(1, "fares-2", "n2", "heartbeat", SILENT);
        h.at(2, "fares-3", "n3", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-3")).containsExactly("hold [blast-radius]");
        assertThat((java.util.List<?>) h.lastVerdict("fares-3").get("messages")).anySatisfy(m -> assertThat(m.toString()).contains("fleet-wide"));
    }

    @Test
    void heldWindowClosedInsideAFreezeUntilTheFreezeEnds() {
        String tend = """
                freezes:
                  - { from: 2027-03-14T01:00:00Z, until: 2027-03-14T06:00:00Z, reason: city marathon }
                """;
        EngineHarness h = new EngineHarness(FLEET, tend, replacePlaybook("0s", "keep-replicas: false"));
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-1")).containsExactly("hold [window-closed]");
        assertThat(h.lastVerdict("fares-1")).containsEntry("hold_until", "2027-03-14T06:00:00Z");
        h.advanceTo(Instant.parse("2027-03-14T06:00:00Z"));
        assertThat(h.verdicts("fares-1")).containsExactly("hold [window-closed]", "start []");
    }

    @Test
    void anEngineFedTheSameInputsRebuildsTheSameBrakeAsRecoveryDoesFromTheJournal() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false"));
        h.send(new Input.EngageBrake("maintenance", "ana", "cli"));
        h.advance(Duration.ofMinutes(1));
        // a fresh engine fed the same inputs at the same times, as recover() does from the journal
        EngineHarness restarted = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false"));
        restarted.send(new Input.EngageBrake("maintenance", "ana", "cli"));
        restarted.advance(Duration.ofMinutes(1));
        assertThat(restarted.engine.brake()).isEqualTo(h.engine.brake());
        restarted.at(120, "fares-1", "n2", "heartbeat", SILENT);
        assertThat(restarted.verdicts("fares-1")).containsExactly("hold [fleet-brake]");
    }
}
