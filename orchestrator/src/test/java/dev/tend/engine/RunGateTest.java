package dev.tend.engine;

import dev.tend.shared.RunState;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.List;
import java.util.Map;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.shared.SignalState.BREACH;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

/** Gates inside a run and confirmation after a lifted mask (DESIGN.md section 4), through the engine. */
class RunGateTest {
    private static final String FLEET = fleet(cluster("fares-17", "standard", 3, null));

    static String replace(String replaceStepExtra) {
        return """
                playbook: replace-silent-node
                version: 1
                trigger: { signal: heartbeat, state: silent, scope: node, confirm-for: 0s }
                unless:
                  - { signal: storage-full, on: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                  - { id: replace, action: replace-node, timeout: 30m%s }
                  - { id: settle, wait-healthy: [heartbeat], within: 20m }
                on-stand-down:
                  - { id: undrain, action: undrain-node, timeout: 10m }
                """.formatted(replaceStepExtra);
    }

    private static List<String> actionsCalled(EngineHarness h) {
        return h.effects.stream().filter(e -> e instanceof Effect.CallExecutor).map(e -> ((Effect.CallExecutor) e).action().id().value())
                .toList();
    }

    private static Map<String, Object> ended(EngineHarness h) {
        return h.ledger("run-ended").get(0);
    }

    @Test
    void aTriggerThatClearsDuringTheFirstStepStandsTheRunDownBeforeTheSecondAndRunsOnStandDown() {
        EngineHarness h = new EngineHarness(FLEET, null, replace(""));
        h.at(0, "fares-17", "n2", "heartbeat", SILENT);
        h.at(30, "fares-17", "n2", "heartbeat", CLEAR);   // the node came back while it was being drained
        h.advance(Duration.ofSeconds(30));
        h.answerCalls(true);                              // drain done: the gate finds the problem gone
        h.advance(Duration.ofMinutes(1));
        h.answerCalls(true);                              // undrain done
        assertThat(actionsCalled(h)).containsExactly("drain-node", "undrain-node");
        assertThat(h.ledger("run-standing-down")).singleElement().satisfies(s -> {
            assertThat(s).containsEntry("reason", "cleared").containsEntry("before_step", "replace");
            assertThat(String.valueOf(s.get("message"))).contains("heartbeat is no longer in breach or silent on fares-17/n2");
        });
        assertThat(ended(h)).containsEntry("state", "stood-down").containsEntry("stand_down", "cleared");
        assertThat(h.engine.runs()).singleElement().satisfies(r -> {
            assertThat(r.state()).isEqualTo(RunState.STOOD_DOWN);
            assertThat(r.outcome()).startsWith("stood down (cleared): ");
        });
    }

    @Test
    void aRunThatStoodDownPagesWithItsOwnKindWhenItsPlaybookAsksForIt() {
        String playbook = replace("") + "  - { id: tell-owner, page: oncall, message: \"{run} stood down on {cluster}/{node}\" }\n"
                + "on-failure:\n  - { id: tell-failed, page: oncall, message: \"{run} failed\" }\n";
        EngineHarness h = new EngineHarness(FLEET, null, playbook);
        h.at(0, "fares-17", "n2", "heartbeat", SILENT);
        h.at(30, "fares-17", "n2", "heartbeat", CLEAR);
        h.advance(Duration.ofSeconds(30));
        h.answerCalls(true);
        h.advance(Duration.ofMinutes(1));
        h.answerCalls(true);
        assertThat(h.effects.stream().filter(e -> e instanceof Effect.Notify).map(e -> (Effect.Notify) e)).singleElement()
                .satisfies(n -> {
                    assertThat(n.kind()).isEqualTo(PageKind.STOOD_DOWN).isEqualTo("stood-down");
                    assertThat(n.fields()).containsEntry("stand_down", "cleared").containsEntry("cluster", "fares-17");
                    assertThat(n.message()).endsWith("stood down on fares-17/n2");
                });
        assertThat(ended(h)).containsEntry("state", "stood-down");
    }

    @Test
    void aStepWrittenIfClearedContinueRunsEvenThoughTheTriggerCleared() {
        EngineHarness h = new EngineHarness(FLEET, null, replace(", if-cleared: continue"));
        h.at(0, "fares-17", "n2", "heartbeat", SILENT);
        h.at(30, "fares-17", "n2", "heartbeat", CLEAR);
        h.settle();
        assertThat(actionsCalled(h)).containsExactly("drain-node", "replace-node");
        assertThat(ended(h)).containsEntry("state", "succeeded");
    }

    @Test
    void aMaskThatComesToApplyDuringARunStandsItDownMaskedAndTheProblemWaitsForTheMaskToLift() {
        EngineHarness h = new EngineHarness(FLEET, "defaults: { cooldown: 0s }\n", replace(""));
        h.at(0, "fares-17", "n2", "heartbeat", SILENT);
        h.at(20, "fares-17", "n2", "storage-full", BREACH);
        h.advance(Duration.ofSeconds(40));
        h.answerCalls(true);
        h.advance(Duration.ofMinutes(1));
        h.answerCalls(true);
        assertThat(actionsCalled(h)).containsExactly("drain-node", "undrain-node");
        assertThat(ended(h)).containsEntry("stand_down", "masked");
        assertThat(h.verdicts("fares-17").get(h.verdicts("fares-17").size() - 1)).isEqualTo("deny [masked]");
    }

    @Test
    void anExclusionAddedDuringARunStandsItDownExcluded() {
        EngineHarness h = new EngineHarness(FLEET, null, replace(""));
        h.at(0, "fares-17", "n2", "heartbeat", SILENT);
        h.send(new Input.Exclude(Target.node(Id.of("fares-17"), Id.of("n2")), "disk swap", "team-fares", null, "olga", "127.0.0.1"));
        h.settle();
        assertThat(actionsCalled(h)).containsExactly("drain-node", "undrain-node");
        assertThat(ended(h)).containsEntry("stand_down", "excluded");
    }

    @Test
    void aMaskThatLiftsRestartsConfirmation() {
        String restart = """
                playbook: restart-stopped-process
                version: 1
                trigger: { signal: process-down, state: breach, scope: node, confirm-for: 5m }
                unless:
                  - { signal: storage-full, on: node }
                steps:
                  - { id: restart, action: restart-process, timeout: 5m }
                """;
        EngineHarness h = new EngineHarness(FLEET, null, restart);
        h.at(0, "fares-17", "n2", "storage-full", BREACH);
        h.at(10, "fares-17", "n2", "process-down", BREACH);
        h.at(29 * 60, "fares-17", "n2", "storage-full", CLEAR);   // the owner cleared the disk; the process is still down
        assertThat(h.ledger("run-started")).as("not at once: the owner may still be at work").isEmpty();
        assertThat(h.verdicts("fares-17")).containsExactly("deny [masked, unconfirmed]", "deny [masked]", "hold [unconfirmed]");
        h.advance(Duration.ofMinutes(4));
        assertThat(h.ledger("run-started")).isEmpty();
        h.advance(Duration.ofMinutes(1));
        assertThat(h.ledger("run-started")).hasSize(1);
        assertThat(Duration.between(EngineHarness.T0, h.engine.runs().iterator().next().startedAt())).isEqualTo(Duration.ofMinutes(34));
    }
}
