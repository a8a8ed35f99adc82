package dev.tend.engine;

import dev.tend.shared.RunState;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.Map;

import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class ApprovalAndBrakeTest {
    private static final String FLEET = EngineHarness.TIERED_FLEET;
    private static final String APPROVED_PLAYBOOK = EngineHarness.APPROVAL_PLAYBOOK;


    @Test
    void criticalClusterAwaitsApprovalAndStartsOnceAPersonApproves() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-1")).containsExactly("await-approval [approval-required]");
        assertThat(h.calls).isEmpty();
        h.send(new Input.Approve(h.pendingRun(), "ana", "cli"));
        assertThat(h.ledger("approval-granted")).singleElement().satisfies(a -> assertThat(a).containsEntry("by", "ana"));
        assertThat(h.ledger("run-started")).singleElement().satisfies(r -> assertThat(r).containsEntry("run", h.pendingRun()));
    }

    @Test
    void standardClusterNeedsNoApproval() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-9", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-9")).containsExactly("start []");
    }

    @Test
    void whoeverRequestedARunCannotApproveIt() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        h.send(new Input.Approve(h.pendingRun(), Engine.AUTOMATION, "api"));
        assertThat(h.ledger("approval-refused")).singleElement()
                .satisfies(a -> assertThat((String) a.get("reason")).contains("two-person rule"));
        assertThat(h.ledger("run-started")).isEmpty();
    }

    @Test
    void approvalNeverOverridesTheBrakeTheRunStaysHeldAndStartsWhenReleased() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        h.send(new Input.EngageBrake("zone z-b maintenance", "ana", "cli"));
        h.send(new Input.Approve(h.pendingRun(), "ben", "cli"));
        assertThat(h.ledger("run-started")).isEmpty();
        assertThat(h.verdicts("fares-1")).containsExactly("await-approval [approval-required]", "hold [fleet-brake]");
        assertThat(h.engine.run(h.pendingRun()).orElseThrow().state()).isEqualTo(RunState.HELD);
        h.send(new Input.ReleaseBrake("maintenance over", "ana", "cli"));
        assertThat(h.ledger("run-started")).hasSize(1);
    }

    @Test
    void rejectedRunIsCancelled() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        h.send(new Input.Reject(h.pendingRun(), "owner is on it", "ben", "cli"));
        assertThat(h.engine.run(h.pendingRun()).orElseThrow().state()).isEqualTo(RunState.CANCELLED);
        assertThat(h.ledger("approval-rejected")).hasSize(1);
    }

    @Test
    void approvalLapsesAtItsExpiryAndTheRunIsCancelled() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        h.advance(Duration.ofMinutes(31));
        assertThat(h.ledger("approval-lapsed")).hasSize(1);
        RunSnapshot r = h.engine.run(h.pendingRun()).orElseThrow();
        assertThat(r.state()).isEqualTo(RunState.CANCELLED);
        assertThat(r.outcome()).contains("lapsed");
    }

    @Test
    void manualBrakeHoldsEveryStartAndIsNotReleasedAutomatically() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false"));
        h.send(new Input.EngageBrake("change freeze for the city marathon", "ana", "cli"));
        h.at(0, "fares-9", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-9")).containsExactly("hold [fleet-brake]");
        h.advance(Duration.ofHours(2));
        assertThat(h.engine.brake().engaged()).isTrue();
        assertThat(h.ledger("brake-engaged")).singleElement().satisfies(b -> assertThat(b).containsEntry("by", "ana"));
        h.send(new Input.ReleaseBrake("done", "ana", "cli"));
        assertThat(h.verdicts("fares-9")).containsExactly("hold [fleet-brake]", "start []");
        assertThat(h.ledger("operator-command")).extracting(m -> m.get("command"))
                .containsExactly("brake-engage", "brake-release");
        assertThat(h.ledger("brake-released")).singleElement().satisfies(b -> assertThat((Map<String, Object>) b).containsEntry("by", "ana"));
    }

    @Test
    void anExclusionThatWouldEndBeforeItBeginsIsRefusedOnTheRecordNotThrown() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "keep-replicas: false"));
        h.send(new Input.Exclude(dev.tend.shared.Target.cluster(dev.tend.shared.Id.of("fares-9")), "owner migrating", "payments",
                EngineHarness.T0.minusSeconds(60), "ana", "cli"));
        assertThat(h.ledger("command-refused")).singleElement()
                .satisfies(r -> assertThat((String) r.get("reason")).contains("must be after its start"));
        h.at(0, "fares-9", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-9")).containsExactly("start []");
    }
}
