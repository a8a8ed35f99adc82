package dev.tend.engine;

import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.Map;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.shared.SignalState.BREACH;
import static org.assertj.core.api.Assertions.assertThat;

/** The topology decides what exists (DESIGN.md sections 3 and 4): unknown targets are shown and ledgered, never remediated. */
class UnknownTargetTest {
    private static final String FLEET = fleet(cluster("fares-3", "standard", 3, null));

    private static final String RESTART = """
            playbook: restart-stopped-process
            version: 1
            trigger: { signal: process-down, state: breach, scope: node }
            steps:
              - { id: restart, action: restart-process, timeout: 5m }
            """;

    @Test
    void anUnknownNodeOfAKnownClusterIsDeniedUnknownTargetAndLedgered() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.at(0, "fares-3", "n9", "process-down", BREACH);
        h.advance(java.time.Duration.ofMinutes(30));
        assertThat(h.ledger("run-started")).isEmpty();
        assertThat(h.verdicts("fares-3")).containsExactly("deny [unknown-target]");
        assertThat(String.valueOf(h.lastVerdict("fares-3").get("messages")))
                .contains("node n9 is not in the topology of cluster fares-3");
        assertThat(h.ledger("transition")).singleElement().satisfies(t -> assertThat(t).containsEntry("unknown_target", true));
        assertThat(h.engine.health().isActive(Id.of("fares-3"), Id.of("n9"), Id.of("process-down")))
                .as("kept in the health view").isTrue();
    }

    @Test
    void anUnknownClusterIsDeniedUnknownTargetFirstInGuardOrder() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.at(0, "fares-33", "n1", "process-down", BREACH);
        assertThat(h.ledger("run-started")).isEmpty();
        // every guard runs and lists its reason; unknown-target comes first
        assertThat(h.verdicts("fares-33")).singleElement().asString().startsWith("deny [unknown-target");
    }

    @Test
    void aNodeThatJoinsIsKnownFromThenOnAndItsProblemIsRemediated() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.at(0, "fares-3", "n4", "process-down", BREACH);
        assertThat(h.verdicts("fares-3")).containsExactly("deny [unknown-target]");
        h.send(new Input.Topology(new TopologyEvent(h.now, Id.of("fares-3"), Id.of("n4"), TopologyChange.JOINED,
                Map.of("zone", "z-a"), Map.of())));
        assertThat(h.ledger("run-started")).hasSize(1);
    }

    @Test
    void excludingAnUnknownClusterIsRefusedOnTheRecordWithTheNearestKnownName() {
        EngineHarness h = new EngineHarness(FLEET, null, RESTART);
        h.send(new Input.Exclude(Target.cluster(Id.of("fares-33")), "disk swap", "team-fares", Instant.parse("2027-03-15T00:00:00Z"),
                "olga", "127.0.0.1"));
        assertThat(h.ledger("exclusion-added")).isEmpty();
        assertThat(h.ledger("command-refused")).singleElement().satisfies(r -> {
            assertThat(r).containsEntry("code", "unknown-target");
            assertThat(String.valueOf(r.get("reason"))).startsWith("cluster fares-33 is not in the topology (did you mean 'fares-3'?)");
        });
    }
}
