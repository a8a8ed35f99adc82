package dev.tend.shared.fleet;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

class SignalNumberingTest {
    private static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");

    private static Fleet fleet() {
        List<ClusterSpec> clusters = new ArrayList<>();
        for (int c = 1; c <= 4; c++) {
            clusters.add(new ClusterSpec(Id.of("fares-" + c), Map.of(), null, true, List.of(
                    new NodeSpec(Id.of("n1"), "z-a", Map.of()), new NodeSpec(Id.of("n2"), "z-b", Map.of()))));
        }
        return Fleet.of("larkspur", clusters);
    }

    @Test
    void numbersEachSignalOnceInTheOrderMetWithOneKey() {
        SignalNumbering n = new SignalNumbering();
        SignalNumbering.Numbered a = n.of(Id.of("fares-1"), Id.of("n1"), Id.of("heartbeat"));
        SignalNumbering.Numbered b = n.of(Id.of("fares-1"), null, Id.of("cert-expiry"));
        assertThat(n.of(Id.of("fares-1"), Id.of("n1"), Id.of("heartbeat"))).isSameAs(a);
        assertThat(a.number()).isZero();
        assertThat(b.number()).isEqualTo(1);
        assertThat(b.key()).isEqualTo(new SignalKey(Id.of("fares-1"), null, Id.of("cert-expiry")));
        assertThat(n.size()).isEqualTo(2);
    }

    @Test
    void manyKeysAreNumberedOnceEachWhicheverInstancesTheirIdsAre() {
        SignalNumbering n = new SignalNumbering();
        List<SignalNumbering.Numbered> first = new ArrayList<>();
        for (int c = 0; c < 3_000; c++) {
            for (String node : new String[]{null, "n1", "n2"}) {
                first.add(n.of(Id.of("fares-" + c), node == null ? null : Id.of(node), Id.of("heartbeat")));
            }
        }
        assertThat(n.size()).isEqualTo(9_000);
        int i = 0;
        for (int c = 0; c < 3_000; c++) {
            for (String node : new String[]{null, "n1", "n2"}) {
                // new Id instances of equal values: the same numbered key, and a cluster-level key is not a node's
                SignalNumbering.Numbered again = n.of(Id.of("fares-" + c), node == null ? null : Id.of(node), Id.of("heartbeat"));
                assertThat(again).isSameAs(first.get(i));
                assertThat(again.number()).isEqualTo(i++);
            }
        }
        assertThat(n.size()).isEqualTo(9_000);
    }

    @Test
    void aViewHandedNumberedKeysAnswersAsOneHandedNone() {
        // two readers' numberings and unnumbered transitions, mixed: the view must find the same slot for equal keys
        FleetHealthView plain = new FleetHealthView(fleet());
        FleetHealthView numbered = new FleetHealthView(fleet());
        SignalNumbering first = new SignalNumbering();
        SignalNumbering second = new SignalNumbering();
        Random random = new Random(7);
        String[] signals = {"heartbeat", "replica-lag", "disk-full"};
        SignalState[] states = SignalState.values();
        for (int i = 0; i < 5_000; i++) {
            Id cluster = Id.of("fares-" + (1 + random.nextInt(5)));
            Id node = random.nextInt(4) == 0 ? null : Id.of("n" + (1 + random.nextInt(3)));
            Id signal = Id.of(signals[random.nextInt(signals.length)]);
            HealthTransition t = new HealthTransition(T0.plusSeconds(i - random.nextInt(30)), cluster, node, signal,
                    states[random.nextInt(states.length)], Map.of(), Map.of());
            ApplyOutcome expected = plain.apply(t);
            int how = random.nextInt(3);
            ApplyOutcome got = how == 0 ? numbered.apply(t)
                    : numbered.apply(t, (how == 1 ? first : second).of(cluster, node, signal));
            assertThat(got).as("event %d", i).isEqualTo(expected);
            SignalKey key = t.key();
            assertThat(numbered.status(key)).isEqualTo(plain.status(key));
            assertThat(numbered.isActive(cluster, node, signal)).isEqualTo(plain.isActive(cluster, node, signal));
            assertThat(numbered.changesSince(key, T0.plusSeconds(i - 600))).isEqualTo(plain.changesSince(key, T0.plusSeconds(i - 600)));
            assertThat(numbered.isInTopology(key)).isEqualTo(plain.isInTopology(key));
        }
        assertThat(numbered.unhealthyClusters()).isEqualTo(plain.unhealthyClusters());
        assertThat(numbered.lateEvents()).isEqualTo(plain.lateEvents());
        assertThat(numbered.memo().signals()).hasSameSizeAs(plain.memo().signals());
    }
}
