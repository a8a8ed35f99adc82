package dev.tend.engine;

import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * Over random transition sequences (a seeded generator: the same seeds give the same
 * sequences), no action step of a playbook's steps is ever called while, at that moment, its
 * trigger is clear or a mask of the playbook is active on the target.
 */
class RunGatePropertyTest {
    private static final String[] NODES = {"n1", "n2", "n3"};

    @Test
    void noActionStepRunsWhileItsTriggerIsClearOrMaskedAtThatMoment() {
        Random random = new Random(20261202L);
        StringBuilder clusters = new StringBuilder();
        for (int c = 1; c <= 4; c++) clusters.append(cluster("fares-" + c, "standard", 3, null));
        int calls = 0, standDowns = 0;
        for (int round = 0; round < 60; round++) {
            EngineHarness h = new EngineHarness(fleet(clusters.toString()), "defaults: { cooldown: 0s, loop: 100/1h }\n",
                    RunGateTest.replace(""));
            int checked = 0;
            for (int i = 0; i < 80; i++) {
                h.advance(Duration.ofSeconds(random.nextInt(90)));
                String cluster = "fares-" + (1 + random.nextInt(4));
                String node = NODES[random.nextInt(3)];
                String signal = random.nextInt(3) == 0 ? "storage-full" : "heartbeat";
                SignalState state = random.nextBoolean() ? SignalState.CLEAR : signal.equals("heartbeat") ? SignalState.SILENT : SignalState.BREACH;
                int before = h.effects.size();
                h.send(new Input.Transition(dev.tend.shared.HealthTransition.of(h.now, cluster, node, signal, state)));
                checked += check(h, before);
                if (random.nextInt(3) == 0) {
                    before = h.effects.size();
                    h.answerCalls(random.nextInt(10) > 0);
                    checked += check(h, before);
                }
            }
            calls += checked;
            standDowns += h.ledger("run-standing-down").size();
        }
        assertThat(calls).as("action steps checked").isGreaterThan(100);
        assertThat(standDowns).as("the sequences do reach the gate").isPositive();
    }

    /** Checks every main-step call among the effects after index {@code from}; returns how many. */
    private static int check(EngineHarness h, int from) {
        int n = 0;
        List<Effect> fresh = new ArrayList<>(h.effects.subList(from, h.effects.size()));
        for (Effect e : fresh) {
            if (!(e instanceof Effect.CallExecutor c) || c.stepId().equals("undrain")) continue;
            Id cluster = c.target().cluster();
            Id node = c.target().node();
            assertThat(h.engine.health().isActive(cluster, node, Id.of("heartbeat")))
                    .as("%s of %s on %s: the trigger holds", c.stepId(), c.runId(), c.target()).isTrue();
            assertThat(h.engine.health().isActive(cluster, node, Id.of("storage-full")))
                    .as("%s of %s on %s: no mask applies", c.stepId(), c.runId(), c.target()).isFalse();
            n++;
        }
        return n;
    }
}
