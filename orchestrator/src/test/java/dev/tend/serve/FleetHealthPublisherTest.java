package dev.tend.serve;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.FleetFile;
import org.junit.jupiter.api.Test;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;

class FleetHealthPublisherTest {
    private static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");
    private static final String FLEET = """
            fleet: larkspur-test
            clusters:
              - id: fares-1
                replication: { factor: 3, min-healthy: 2 }
                nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }]
              - id: dispatch-1
                replication: { factor: 3, min-healthy: 2 }
                nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-a }, { id: n3, zone: z-b }]
              - id: tickets-2
                nodes: [{ id: n1, zone: z-c }, { id: n2 }]
            """;

    @Test
    void keptByClusterTheHealthPictureEqualsOneRebuiltWholeAfterEveryBatch() {
        rounds(40, false);
    }

    @Test
    void withManyTopologyEventsTheCountsPerZoneStayThoseOfAWholeCount() {
        rounds(4, false);
    }

    @Test
    void aListenerOneBatchBehindTheEngineEndsWithTheWholePicture() {
        // the driver decides the next batch before the one before is committed and listened to
        rounds(4, true);
    }

    /** Rounds of batches with a topology event one time in {@code topologyOneIn}; listened to at once, or one batch late. */
    private static void rounds(int topologyOneIn, boolean oneBehind) {
        Actions actions = PlaybookLoader.parseActions("actions.yaml", "actions: {}\n");
        TendConfig config = TendConfig.builtIn();
        Engine engine = new Engine(new EngineSetup(PlaybookSet.of(List.of(), actions, config), config,
                FleetFile.parse("fleet.yaml", FLEET), BrakeThresholds.from(config.brake()), EventTimeMode.following(Duration.ZERO)));
        Clock clock = Clock.fixed(T0, ZoneOffset.UTC);
        FleetHealthPublisher kept = new FleetHealthPublisher(clock);
        kept.publish(engine);
        String[] clusters = {"fares-1", "dispatch-1", "tickets-2", "schedules-9"}; // the last is outside the topology
        String[] signals = {"heartbeat", "disk-latency", "process-down"};
        SplittableRandom random = new SplittableRandom(5);
        Instant now = T0;
        int unhealthySeen = 0;
        List<Input> behind = null;
        int topologyEvents = 0;
        for (int round = 0; round < 400; round++) {
            List<Input> batch = new ArrayList<>();
            List<Effect> effects = new ArrayList<>();
            int size = 1 + random.nextInt(4);
            for (int i = 0; i < size; i++) {
                now = now.plusSeconds(1);
                String cluster = clusters[random.nextInt(clusters.length)];
                String node = random.nextInt(6) == 0 ? null : "n" + (1 + random.nextInt(4)); // n4 is not in the topology
                Input in;
                if (random.nextInt(topologyOneIn) == 0 && node != null) {
                    in = new Input.Topology(new TopologyEvent(now, dev.tend.shared.Id.of(cluster), dev.tend.shared.Id.of(node),
                            random.nextBoolean() ? TopologyChange.JOINED : TopologyChange.LEFT,
                            java.util.Map.of("zone", "z-" + (char) ('a' + random.nextInt(3))), java.util.Map.of()));
                    topologyEvents++;
                } else {
                    SignalState state = SignalState.values()[random.nextInt(3)];
                    // now and then late, or at the instant of the one before: a cluster such a transition
                    // names is looked at again only when it may have changed something
                    Instant at = random.nextInt(8) == 0 ? now.minusSeconds(random.nextInt(3)) : now;
                    in = new Input.Transition(HealthTransition.of(at, cluster, node, signals[random.nextInt(signals.length)], state));
                }
                batch.add(in);
                effects.addAll(engine.handle(in, now));
            }
            if (oneBehind) {
                if (behind != null) kept.committed(engine, behind, List.of());
                behind = batch;
                continue;
            }
            kept.committed(engine, batch, effects);
            FleetHealthPublisher whole = new FleetHealthPublisher(clock);
            whole.publish(engine);
            assertThat(kept.get()).as("after round " + round).isEqualTo(whole.get());
            unhealthySeen = Math.max(unhealthySeen, kept.get().unhealthy());
        }
        if (oneBehind) {
            kept.committed(engine, behind, List.of());
            FleetHealthPublisher whole = new FleetHealthPublisher(clock);
            whole.publish(engine);
            assertThat(kept.get()).isEqualTo(whole.get());
        } else {
            assertThat(unhealthySeen).as("the rounds made clusters unhealthy").isGreaterThanOrEqualTo(3);
        }
        assertThat(topologyEvents).as("topology events among the inputs").isGreaterThanOrEqualTo(400 * 2 / topologyOneIn / 2);
    }
}
