package dev.tend.engine;

import dev.tend.shared.Id;
import dev.tend.shared.Target;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

import java.time.Duration;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.BREACH;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class FleetSafetyGuardsTest {
    /** Only the guard under test may object: blast radius and replication are opened wide. */
    private static final String QUORUM_ONLY = "impaired-fraction: 1.0, keep-replicas: false, per-cluster: 5";

    @ParameterizedTest(name = "{0}-node ensemble with {1} other impaired node(s): {2}")
    @CsvSource({"3,0,start", "3,1,hold", "5,1,start", "5,2,hold"})
    void majorityQuorumToleratesFloorOfNMinusOneOverTwoImpairedNodes(int nodes, int otherImpaired, String verdict) {
        // a majority quorum of n tolerates floor((n-1)/2) impaired nodes: Lamport, "Paxos Made Simple", 2001;
        // Ongaro and Ousterhout, "In Search of an Understandable Consensus Algorithm", 2014.
        // The candidate's own target counts as impaired: 3 nodes tolerate 1 in all, 5 tolerate 2.
        EngineHarness h = new EngineHarness(fleet(cluster("coord-1", "critical", nodes, "quorum: true")), null,
                replacePlaybook("0s", QUORUM_ONLY));
        for (int i = 0; i < otherImpaired; i++) h.at(i, "coord-1", "n" + (nodes - i), "disk-latency", BREACH);
        h.at(30, "coord-1", "n1", "heartbeat", SILENT);
        assertThat(h.lastVerdict("coord-1").get("verdict")).isEqualTo(verdict);
        if (verdict.equals("hold")) assertThat(h.verdicts("coord-1")).containsExactly("hold [quorum]");
    }

    @ParameterizedTest(name = "RF {0} min-healthy {1}, {2} other impaired: {3}")
    @CsvSource({"3,2,0,start", "3,2,1,hold", "3,1,1,start", "3,1,2,hold"})
    void replicationKeepsEveryPieceOfDataAtItsMinimumOfHealthyCopies(int rf, int min, int otherImpaired, String verdict) {
        // quorum-based replication (Gifford, "Weighted Voting for Replicated Data", SOSP 1979): with N copies of which
        // at least M must stay healthy, at most N - M copies may be impaired at once; so factor 3 with min-healthy 2
        // tolerates one impaired copy, factor 3 with min-healthy 1 tolerates two. Without placement any RF nodes may
        // hold copies of the same piece (worst case).
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 6,
                "replication: { factor: " + rf + ", min-healthy: " + min + " }")), null,
                replacePlaybook("0s", "impaired-fraction: 1.0, per-cluster: 5"));
        for (int i = 0; i < otherImpaired; i++) h.at(i, "fares-3", "n" + (6 - i), "disk-latency", BREACH);
        h.at(30, "fares-3", "n1", "heartbeat", SILENT);
        assertThat(h.lastVerdict("fares-3").get("verdict")).isEqualTo(verdict);
        if (verdict.equals("hold")) assertThat(h.verdicts("fares-3")).containsExactly("hold [replication]");
    }

    @Test
    void blastRadiusHoldsWhenTheImpairedShareWouldPassTheCapAndReleasesWhenANodeRecovers() {
        EngineHarness h = new EngineHarness(fleet(cluster("tickets-2", "standard", 4, null)), null,
                replacePlaybook("0s", "impaired-fraction: 0.5, keep-replicas: false, per-cluster: 5"));
        h.at(0, "tickets-2", "n3", "disk-latency", BREACH);
        h.at(1, "tickets-2", "n4", "disk-latency", BREACH);
        h.at(2, "tickets-2", "n1", "heartbeat", SILENT);
        assertThat(h.verdicts("tickets-2")).containsExactly("hold [blast-radius]");
        h.at(60, "tickets-2", "n4", "disk-latency", CLEAR);
        assertThat(h.verdicts("tickets-2")).containsExactly("hold [blast-radius]", "start []");
    }

    @Test
    void cooldownHoldsTheSameTargetUntilItEnds() {
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 3, null)), null,
                replacePlaybook("0s", "cooldown: 6h, keep-replicas: false"));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.settle();
        h.advance(Duration.ofMinutes(30));
        h.send(new Input.Transition(dev.tend.shared.HealthTransition.of(h.now, "fares-3", "n2", "heartbeat", SILENT)));
        assertThat(h.verdicts("fares-3")).containsExactly("start []", "hold [cooldown]");
        h.advanceTo(EngineHarness.T0.plus(Duration.ofHours(6)).plusSeconds(1));
        assertThat(h.verdicts("fares-3")).endsWith("start []");
    }

    @Test
    void loopDeniesAfterTooManyRunsEscalatesOnceAndWaitsForAPerson() {
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 3, null)), null,
                replacePlaybook("0s", "cooldown: 1m, loop: 2/24h, keep-replicas: false"));
        for (int i = 0; i < 3; i++) {
            h.send(new Input.Transition(dev.tend.shared.HealthTransition.of(h.now, "fares-3", "n2", "heartbeat", SILENT)));
            h.settle();
            h.advance(Duration.ofMinutes(5));
        }
        assertThat(h.verdicts("fares-3")).containsExactly("start []", "start []", "deny [loop]");
        assertThat(h.ledger("loop-stopped")).hasSize(1);
        long pages = h.effects.stream().filter(e -> e instanceof Effect.Notify n && n.id().startsWith("loop/")).count();
        assertThat(pages).isEqualTo(1);
        h.send(new Input.ClearLoop(Id.of("replace-silent-node"), Target.node(Id.of("fares-3"), Id.of("n2")), "ana", "cli"));
        assertThat(h.verdicts("fares-3")).endsWith("start []");
    }

    @Test
    void flappingSignalIsHeldAndPagesOnce() {
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 3, null)), null,
                replacePlaybook("0s", "flapping: 3/10m, keep-replicas: false").replace("confirm-for: 0s", "confirm-for: 1m"));
        for (int i = 0; i < 8; i++) h.at(i * 20L, "fares-3", "n2", "heartbeat", i % 2 == 0 ? SILENT : CLEAR);
        h.advance(Duration.ofMinutes(2));
        assertThat(h.ledger("run-started")).isEmpty();
        assertThat(h.verdicts("fares-3")).contains("hold [unconfirmed, flapping]");
        long pages = h.effects.stream().filter(e -> e instanceof Effect.Notify n && n.id().startsWith("flapping/")).count();
        assertThat(pages).isEqualTo(1);
    }

    @Test
    void changeWindowHoldsUntilItOpens() {
        String pb = replacePlaybook("0s", "keep-replicas: false")
                .replace("steps:", "window: { from: \"04:00\", until: \"05:00\", zone: UTC }\nsteps:");
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 3, null)), null, pb);
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        assertThat(h.verdicts("fares-3")).containsExactly("hold [window-closed]");
        assertThat(h.lastVerdict("fares-3")).containsEntry("hold_until", "2027-03-14T04:00:00Z");
        h.advanceTo(java.time.Instant.parse("2027-03-14T04:00:00Z"));
        assertThat(h.verdicts("fares-3")).containsExactly("hold [window-closed]", "start []");
    }
}
