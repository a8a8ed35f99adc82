package dev.tend.engine;

import dev.tend.shared.StepState;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.List;
import java.util.Map;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.BREACH;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class GuardVerdictsTest {
    private static final String FLEET = fleet(cluster("fares-3", "standard", 3, null) + cluster("fares-4", "standard", 3, null));

    private static final String RESTART = """
            playbook: restart-stopped-process
            version: 1
            trigger: { signal: process-down, state: breach, scope: node }
            unless:
              - { signal: storage-full, on: node }
              - { signal: key-revoked, on: cluster }
            steps:
              - { id: restart, action: restart-process, timeout: 5m }
            """;

    @Test
    void breachOfTwoMinutesStartsNoRunWhenConfirmForIsThreeMinutes() {
        // common practice, no source: a breach is confirmed when it held 3 of the last 5 one-minute
        // evaluations, so confirm-for: 3m must start nothing for a breach that lasted 2 minutes
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("3m", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.at(120, "fares-3", "n2", "heartbeat", CLEAR);
        h.advance(Duration.ofMinutes(10));
        assertThat(h.ledger("run-started")).isEmpty();
        assertThat(h.verdicts("fares-3")).containsExactly("hold [unconfirmed]");
        assertThat(h.ledger("candidate-dropped")).hasSize(1);
    }

    @Test
    void heldUnconfirmedUntilTheProblemHasLastedConfirmForThenStarts() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("3m", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(h.lastVerdict("fares-3")).containsEntry("hold_until_event_time", EngineHarness.T0.plusSeconds(180).toString());
        h.advance(Duration.ofMinutes(3));
        assertThat(h.verdicts("fares-3")).containsExactly("hold [unconfirmed]", "start []");
        assertThat(h.ledger("run-started")).singleElement().satisfies(r -> assertThat(r).containsEntry("node", "n2"));
    }

    @Test
    void aRunFinishesThroughItsStepsAndEndsSucceeded() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.settle();
        assertThat(h.ledger("run-ended")).singleElement().satisfies(r -> assertThat(r).containsEntry("state", "succeeded"));
        assertThat(h.ledger("executor-call")).extracting(m -> m.get("key")).containsExactly("r000001/drain/1", "r000001/replace/1");
        assertThat(h.engine.activeRuns()).isZero();
    }

    @Test
    void deniedMaskedWhenAFullDiskExplainsTheStoppedProcess() {
        // common practice, no source: a full disk explains a stopped broker process, so the restart is masked, not run
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.at(0, "fares-3", "n1", "storage-full", BREACH);
        h.at(30, "fares-3", "n1", "process-down", BREACH);
        assertThat(h.verdicts("fares-3")).containsExactly("deny [masked]");
        assertThat(h.calls).isEmpty();
    }

    @Test
    void maskedByARevokedKeyOnTheClusterAndLetThroughOnceTheOwnerFixedIt() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.at(0, "fares-3", null, "key-revoked", BREACH);
        h.at(10, "fares-3", "n3", "process-down", BREACH);
        h.at(60, "fares-3", null, "key-revoked", CLEAR);
        assertThat(h.verdicts("fares-3")).containsExactly("deny [masked]", "start []");
    }

    @Test
    void deniedExcludedUntilTheExclusionIsRemoved() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", ""));
        h.send(new Input.Exclude(dev.tend.shared.Target.cluster(dev.tend.shared.Id.of("fares-3")), "owner migrating", "payments",
                null, "ana", "cli"));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-3")).containsExactly("deny [excluded]");
        h.send(new Input.Unexclude(dev.tend.shared.Target.cluster(dev.tend.shared.Id.of("fares-3")), "ana", "cli"));
        assertThat(h.verdicts("fares-3")).containsExactly("deny [excluded]", "start []");
    }

    @Test
    void heldClusterBusyUntilTheRunningRunEnds() {
        String fleet = fleet(cluster("fares-3", "standard", 6, null));
        EngineHarness h = new EngineHarness(fleet, null, replacePlaybook("0s", "impaired-fraction: 0.5, keep-replicas: false"));
        h.at(0, "fares-3", "n1", "heartbeat", SILENT);
        h.at(1, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-3")).containsExactly("start []", "hold [cluster-busy]");
        h.settle();
        assertThat(h.ledger("run-started")).hasSize(2);
    }

    @Test
    void heldRateLimitUntilAPermitFreesAndNamesTheTime() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "rate: 1/1h"));
        h.at(0, "fares-3", "n1", "heartbeat", SILENT);
        h.at(5, "fares-4", "n1", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-4")).containsExactly("hold [rate-limit]");
        Object until = h.lastVerdict("fares-4").get("hold_until");
        assertThat(until).isNotNull();
        h.settle();
        h.advanceTo(java.time.Instant.parse((String) until));
        assertThat(h.verdicts("fares-4")).containsExactly("hold [rate-limit]", "start []");
    }

    @Test
    void verdictListsEveryReasonThatAppliesNotOnlyTheFirst() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART.replace("scope: node }", "scope: node, confirm-for: 5m }"));
        h.send(new Input.Exclude(dev.tend.shared.Target.cluster(dev.tend.shared.Id.of("fares-3")), "maintenance", "payments",
                null, "ana", "cli"));
        h.at(0, "fares-3", "n1", "storage-full", BREACH);
        h.at(1, "fares-3", "n1", "process-down", BREACH);
        assertThat(h.verdicts("fares-3")).containsExactly("deny [excluded, masked, unconfirmed]");
    }

    @Test
    void shadowModeRecordsTheRunButNeverCallsAnExecutor() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", "").replace("version: 1", "version: 1\nmode: shadow"));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(h.calls).isEmpty();
        assertThat(h.ledger("run-shadowed")).hasSize(1);
        assertThat(h.ledger("run-ended")).singleElement().satisfies(r -> assertThat(r).containsEntry("state", "shadowed"));
    }

    @Test
    void failedStepRunsOnFailureAndEndsFailed() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.answerCalls(false);
        assertThat(h.ledger("run-ended")).singleElement().satisfies(r -> assertThat(r).containsEntry("state", "failed"));
        assertThat(h.effects).filteredOn(e -> e instanceof Effect.Notify)
                .extracting(e -> ((Effect.Notify) e).message()).containsExactly("replacing n2 in fares-3 failed at drain");
    }

    @Test
    void stepTimeoutFailsTheRun() {
        EngineHarness h = new EngineHarness(FLEET, null, replacePlaybook("0s", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.advance(Duration.ofMinutes(11));
        assertThat(h.ledger("step-timed-out")).hasSize(1);
        assertThat(h.ledger("run-ended")).singleElement().satisfies(r -> assertThat(r).containsEntry("state", "failed"));
        assertThat(h.lastVerdict("fares-3")).containsEntry("verdict", "start");
        assertThat(List.of(h.engine.runs().iterator().next().steps().get(0).state())).containsExactly(StepState.TIMED_OUT);
    }
}
