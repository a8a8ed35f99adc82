package dev.tend.shared.fleet;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;

import static dev.tend.shared.SignalState.BREACH;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class FleetHealthViewTest {
    private static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");
    private static final Id FARES = Id.of("fares-3");

    private static Fleet fleet() {
        return Fleet.of("larkspur", List.of(
                new ClusterSpec(FARES, Map.of("tier", "critical"), new Replication(3, 2), false, List.of(
                        new NodeSpec(Id.of("n1"), "z-a", Map.of()),
                        new NodeSpec(Id.of("n2"), "z-b", Map.of()),
                        new NodeSpec(Id.of("n3"), "z-c", Map.of()))),
                new ClusterSpec(Id.of("dispatch-1"), Map.of(), null, true, List.of(
                        new NodeSpec(Id.of("n1"), "z-a", Map.of()),
                        new NodeSpec(Id.of("n2"), "z-a", Map.of()),
                        new NodeSpec(Id.of("n3"), "z-b", Map.of())))));
    }

    private static HealthTransition t(int minute, String cluster, String node, String signal, dev.tend.shared.SignalState s) {
        return HealthTransition.of(T0.plusSeconds(60L * minute), cluster, node, signal, s);
    }

    @Test
    void tracksStateAndSinceInEventTime() {
        FleetHealthView view = new FleetHealthView(fleet());
        assertThat(view.apply(t(0, "fares-3", "n2", "heartbeat", SILENT))).isEqualTo(ApplyOutcome.OPENED);
        assertThat(view.apply(t(3, "fares-3", "n2", "heartbeat", SILENT))).isEqualTo(ApplyOutcome.REPEATED);
        SignalStatus s = view.status(new SignalKey(FARES, Id.of("n2"), Id.of("heartbeat"))).orElseThrow();
        assertThat(s.since()).isEqualTo(T0);
        assertThat(s.lastAt()).isEqualTo(T0.plusSeconds(180));
        assertThat(view.isNodeImpaired(FARES, Id.of("n2"))).isTrue();
        assertThat(view.health(FARES)).isEqualTo(ClusterHealth.IMPAIRED);
        assertThat(view.unhealthyClusterCount()).isEqualTo(1);
        assertThat(view.impairedPerZone()).containsEntry("z-b", 1);
    }

    @Test
    void lateEventChangesNothingAndIsCounted() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(5, "fares-3", "n2", "heartbeat", SILENT));
        assertThat(view.apply(t(4, "fares-3", "n2", "heartbeat", CLEAR))).isEqualTo(ApplyOutcome.LATE);
        assertThat(view.isNodeImpaired(FARES, Id.of("n2"))).isTrue();
        assertThat(view.lateEvents()).isEqualTo(1);
    }

    @Test
    void outOfOrderAcrossKeysIsNotLate() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(5, "fares-3", "n2", "heartbeat", SILENT));
        assertThat(view.apply(t(1, "fares-3", "n1", "heartbeat", SILENT))).isEqualTo(ApplyOutcome.OPENED);
        assertThat(view.lateEvents()).isZero();
    }

    @Test
    void clearingTheLastProblemMakesTheClusterHealthyAgain() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(0, "fares-3", "n2", "heartbeat", SILENT));
        view.apply(t(1, "fares-3", "n2", "storage-full", BREACH));
        view.apply(t(2, "fares-3", "n2", "heartbeat", CLEAR));
        assertThat(view.isNodeImpaired(FARES, Id.of("n2"))).isTrue();
        assertThat(view.apply(t(3, "fares-3", "n2", "storage-full", CLEAR))).isEqualTo(ApplyOutcome.CLEARED);
        assertThat(view.health(FARES)).isEqualTo(ClusterHealth.HEALTHY);
        assertThat(view.unhealthyClusterCount()).isZero();
        assertThat(view.impairedPerZone()).isEmpty();
    }

    @Test
    void moreImpairedNodesThanAQuorumToleratesIsUnhealthy() {
        // a majority quorum of 3 tolerates floor((3-1)/2) = 1 failure (Lamport, "Paxos Made Simple", 2001)
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(0, "dispatch-1", "n1", "heartbeat", SILENT));
        assertThat(view.health(Id.of("dispatch-1"))).isEqualTo(ClusterHealth.IMPAIRED);
        view.apply(t(0, "dispatch-1", "n2", "heartbeat", SILENT));
        assertThat(view.health(Id.of("dispatch-1"))).isEqualTo(ClusterHealth.UNHEALTHY);
    }

    @Test
    void clusterLevelSignalMakesTheClusterUnhealthy() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(0, "fares-3", null, "key-revoked", BREACH));
        assertThat(view.health(FARES)).isEqualTo(ClusterHealth.UNHEALTHY);
        assertThat(view.isActive(FARES, null, Id.of("key-revoked"))).isTrue();
        assertThat(view.activeSignals(FARES, null)).containsOnlyKeys(Id.of("key-revoked"));
    }

    @Test
    void countsStateChangesInAWindowForFlapping() {
        FleetHealthView view = new FleetHealthView(fleet());
        for (int m = 0; m < 6; m++) view.apply(t(m, "fares-3", "n1", "replica-lag", m % 2 == 0 ? BREACH : CLEAR));
        SignalKey key = new SignalKey(FARES, Id.of("n1"), Id.of("replica-lag"));
        assertThat(view.changesWithin(key, T0.plusSeconds(300), Duration.ofMinutes(10))).isEqualTo(6);
        assertThat(view.changesWithin(key, T0.plusSeconds(300), Duration.ofMinutes(2))).isEqualTo(3);
    }

    @Test
    void topologyEventsJoinMoveAndRemoveNodes() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(new TopologyEvent(T0, FARES, Id.of("n4"), TopologyChange.JOINED, Map.of("zone", "z-b"), Map.of()));
        assertThat(view.topology().cluster(FARES).orElseThrow().size()).isEqualTo(4);
        view.apply(new TopologyEvent(T0.plusSeconds(60), FARES, Id.of("n4"), TopologyChange.CHANGED, Map.of("zone", "z-c"), Map.of()));
        assertThat(view.topology().cluster(FARES).orElseThrow().node(Id.of("n4")).orElseThrow().zone()).isEqualTo("z-c");
        assertThat(view.apply(new TopologyEvent(T0.plusSeconds(30), FARES, Id.of("n4"), TopologyChange.LEFT, Map.of(), Map.of())))
                .isEqualTo(ApplyOutcome.LATE);
        view.apply(new TopologyEvent(T0.plusSeconds(120), FARES, Id.of("n4"), TopologyChange.LEFT, Map.of(), Map.of()));
        assertThat(view.topology().cluster(FARES).orElseThrow().size()).isEqualTo(3);
    }

    @Test
    void keepsTheLast32StateChangesOfASignalForFlapping() {
        FleetHealthView view = new FleetHealthView(fleet());
        for (int m = 0; m < 40; m++) view.apply(t(m, "fares-3", "n1", "replica-lag", m % 2 == 0 ? BREACH : CLEAR));
        SignalKey key = new SignalKey(FARES, Id.of("n1"), Id.of("replica-lag"));
        assertThat(view.changesSince(key, T0)).isEqualTo(32);
        assertThat(view.changesSince(key, T0.plusSeconds(60L * 30))).isEqualTo(10);
        assertThat(view.memo().signals().get(0).changes()).hasSize(32).startsWith(T0.plusSeconds(60L * 8)).endsWith(T0.plusSeconds(60L * 39));
        FleetHealthView restored = FleetHealthView.restore(fleet(), view.memo());
        assertThat(restored.changesSince(key, T0.plusSeconds(60L * 30))).isEqualTo(10);
    }

    @Test
    void aSnapshotTakesAgainTheSignalsNoEventReachedAndTakesTheOthersAsTheyAreNow() {
        FleetHealthView view = new FleetHealthView(fleet());
        view.apply(t(0, "fares-3", "n1", "heartbeat", SILENT));
        view.apply(t(1, "fares-3", "n2", "replica-lag", BREACH));
        view.apply(t(2, "fares-3", "n2", "replica-lag", CLEAR));
        Map<SignalKey, HealthMemo.Signal> first = bySignal(view.memo());
        view.apply(t(3, "fares-3", "n2", "replica-lag", CLEAR)); // a repeat moves only lastAt
        view.apply(t(4, "dispatch-1", null, "cert-expiry", BREACH));
        Map<SignalKey, HealthMemo.Signal> second = bySignal(view.memo());
        SignalKey silent = new SignalKey(FARES, Id.of("n1"), Id.of("heartbeat"));
        SignalKey lag = new SignalKey(FARES, Id.of("n2"), Id.of("replica-lag"));
        assertThat(second.get(silent)).isSameAs(first.get(silent));
        assertThat(second.get(lag)).isNotSameAs(first.get(lag));
        assertThat(second.get(lag).lastAt()).isEqualTo(T0.plusSeconds(180));
        assertThat(second.get(lag).since()).isEqualTo(T0.plusSeconds(120));
        assertThat(second.get(lag).changes()).containsExactly(T0.plusSeconds(60), T0.plusSeconds(120));
        assertThat(second).hasSize(3);
        FleetHealthView restored = FleetHealthView.restore(fleet(), view.memo());
        assertThat(bySignal(restored.memo())).isEqualTo(second);
        // both go on alike: a restored view lists its signals in the order of the view it was taken from
        for (FleetHealthView v : List.of(view, restored)) {
            v.apply(t(5, "dispatch-1", "n3", "heartbeat", SILENT));
            v.apply(t(6, "fares-3", "n1", "heartbeat", CLEAR));
        }
        assertThat(restored.memo().signals()).isEqualTo(view.memo().signals()).hasSize(4);
    }

    private static Map<SignalKey, HealthMemo.Signal> bySignal(HealthMemo memo) {
        Map<SignalKey, HealthMemo.Signal> out = new java.util.HashMap<>();
        for (HealthMemo.Signal s : memo.signals()) out.put(s.key(), s);
        return out;
    }

    @Test
    void aSignalsRememberedAnswerKeepsNoOldTopologyAlive() throws InterruptedException {
        // a replay of a large fleet has thousands of topology changes; each old fleet must be collectable
        FleetHealthView view = new FleetHealthView(fleet());
        SignalKey n1 = new SignalKey(FARES, Id.of("n1"), Id.of("replica-lag"));
        view.apply(t(0, "fares-3", "n1", "replica-lag", BREACH));
        java.lang.ref.WeakReference<Fleet> before = new java.lang.ref.WeakReference<>(view.topology());
        assertThat(view.isInTopology(n1)).isTrue();
        view.apply(new TopologyEvent(T0.plusSeconds(60), FARES, Id.of("n4"), TopologyChange.JOINED, Map.of(), Map.of()));
        // n1's slot is not asked again: what it remembers must not hold the old fleet
        for (int i = 0; i < 20 && before.get() != null; i++) {
            System.gc();
            Thread.sleep(10);
        }
        assertThat(before.get()).as("the topology before the change, once replaced").isNull();
    }

    @Test
    void aSignalIsInTheTopologyWhileItsNodeIs() {
        FleetHealthView view = new FleetHealthView(fleet());
        SignalKey n4 = new SignalKey(FARES, Id.of("n4"), Id.of("replica-lag"));
        view.apply(t(0, "fares-3", "n4", "replica-lag", BREACH));
        assertThat(view.isInTopology(n4)).isFalse();
        view.apply(new TopologyEvent(T0.plusSeconds(60), FARES, Id.of("n4"), TopologyChange.JOINED, Map.of(), Map.of()));
        assertThat(view.isInTopology(n4)).isTrue();
        view.apply(new TopologyEvent(T0.plusSeconds(120), FARES, Id.of("n4"), TopologyChange.LEFT, Map.of(), Map.of()));
        assertThat(view.isInTopology(n4)).isFalse();
        assertThat(view.isInTopology(new SignalKey(Id.of("fares-33"), null, Id.of("key-revoked")))).isFalse();
        assertThat(view.isInTopology(new SignalKey(FARES, null, Id.of("key-revoked")))).isTrue();
    }

    @Test
    void aChangeOfZoneLeavesEveryAnswerAndAChangeOfAnUnknownNodeAddsIt() {
        FleetHealthView view = new FleetHealthView(fleet());
        SignalKey n1 = new SignalKey(FARES, Id.of("n1"), Id.of("replica-lag"));
        SignalKey other = new SignalKey(Id.of("fares-33"), null, Id.of("key-revoked"));
        view.apply(t(0, "fares-3", "n1", "replica-lag", BREACH));
        assertThat(view.isInTopology(n1)).isTrue();
        assertThat(view.isInTopology(other)).isFalse();
        view.apply(new TopologyEvent(T0.plusSeconds(60), FARES, Id.of("n1"), TopologyChange.CHANGED, Map.of("zone", "z-c"), Map.of()));
        assertThat(view.isInTopology(n1)).isTrue();
        assertThat(view.isInTopology(other)).isFalse();
        // a change reported for a node the topology lacks adds the node, and its cluster
        view.apply(new TopologyEvent(T0.plusSeconds(120), Id.of("fares-33"), Id.of("n1"), TopologyChange.CHANGED, Map.of(), Map.of()));
        assertThat(view.isInTopology(other)).isTrue();
        assertThat(view.isInTopology(new SignalKey(Id.of("fares-33"), Id.of("n1"), Id.of("replica-lag")))).isTrue();
        view.apply(new TopologyEvent(T0.plusSeconds(180), FARES, Id.of("n1"), TopologyChange.LEFT, Map.of(), Map.of()));
        assertThat(view.isInTopology(n1)).isFalse();
    }
}
