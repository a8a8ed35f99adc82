package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.CLEAR;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * A large-scale event: 150 of 1,000 clusters go silent within two minutes. Common practice,
 * no source: about 150 clusters turning unhealthy within minutes is a large-scale event that
 * deserves one page, not 150, and no automatic starts until it is over.
 */
class StormTest {
    private static final int CLUSTERS = 1000;
    private static final int FLEET_CAP = 10;
    private static final String TEND = """
            defaults: { fleet: %d, per-zone: 5, rate: 50/1h }
            rate: 200/1h
            brake:
              engage-at: { clusters: 25, fraction: 0.08 }
              release-below: { clusters: 10, fraction: 0.03 }
              auto-release: true
            """.formatted(FLEET_CAP);

    @Test
    void brakeEngagesBeforeTheFleetCapPagesOnceStartsNothingWhileEngagedAndRunsResumeAfterRelease() {
        StringBuilder clusters = new StringBuilder();
        for (int i = 1; i <= CLUSTERS; i++) clusters.append(cluster("telemetry-" + i, "standard", 3, null));
        EngineHarness h = new EngineHarness(fleet(clusters.toString()), TEND,
                replacePlaybook("5m", "keep-replicas: false, cooldown: 1h"));

        // three ordinary failures before the storm: their runs are under way when it hits
        for (int i = 1; i <= 3; i++) h.at(i, "telemetry-" + i, "n1", "heartbeat", SILENT);
        h.advanceTo(EngineHarness.T0.plus(Duration.ofMinutes(6)));
        h.answerCalls(true); // the drain steps finish; the replace steps are called
        int startedBefore = h.ledger("run-started").size();

        // the storm: 150 clusters silent within 2 minutes
        long stormStart = Duration.ofMinutes(7).toSeconds();
        for (int i = 0; i < 150; i++) h.at(stormStart + i * 120L / 150, "telemetry-" + (100 + i), "n2", "heartbeat", SILENT);
        int maxActive = h.engine.activeRuns();
        List<Map<String, Object>> engaged = h.ledger("brake-engaged");
        Instant engagedAt = h.engine.brake().since();
        assertThat(engaged).hasSize(1);
        assertThat(h.engine.brake().engaged()).isTrue();

        // the early runs finish their current step and pause at the next step boundary
        h.answerCalls(true);
        assertThat(h.ledger("run-paused")).hasSize(3);

        // an hour of storm: confirmations come due, nothing starts
        for (int m = 0; m < 60; m++) {
            h.advance(Duration.ofMinutes(1));
            maxActive = Math.max(maxActive, h.engine.activeRuns());
        }
        assertThat(h.ledger("run-started")).hasSize(startedBefore);
        long brakePages = h.effects.stream().filter(e -> e instanceof Effect.Notify n && n.id().startsWith("brake/")).count();
        assertThat(brakePages).as("one aggregated page, not 150").isEqualTo(1);
        assertThat(h.notifications()).isEqualTo(1);

        // the zone comes back, except for five nodes that stay silent
        long back = h.now.getEpochSecond() - EngineHarness.T0.getEpochSecond() + 1;
        for (int i = 0; i < 145; i++) h.at(back, "telemetry-" + (100 + i), "n2", "heartbeat", CLEAR);
        assertThat(h.ledger("brake-released")).as("released only after the fleet stayed below the threshold").isEmpty();
        h.advance(Duration.ofMinutes(5));
        assertThat(h.ledger("brake-released")).hasSize(1);
        Instant released = h.engine.brake().engaged() ? null : h.now;
        assertThat(h.ledger("run-resumed")).hasSize(3);
        for (int m = 0; m < 90; m++) {
            h.advance(Duration.ofMinutes(1));
            h.answerCalls(true);
            maxActive = Math.max(maxActive, h.engine.activeRuns());
        }
        List<String> startedAfter = new ArrayList<>();
        for (Map<String, Object> r : h.ledger("run-started")) startedAfter.add((String) r.get("cluster"));
        assertThat(startedAfter).as(startedAfter.toString()).hasSize(startedBefore + 5);
        assertThat(maxActive).isLessThanOrEqualTo(FLEET_CAP);
        System.out.printf("storm test: %d clusters, 150 silent in 2 minutes; runs started before the brake: %d; brake engaged at %s"
                        + " with %s unhealthy clusters; brake pages: %d; starts while engaged: 0; released at %s; runs started after"
                        + " release: %d; most runs active at once: %d (cap %d)%n",
                CLUSTERS, startedBefore, engagedAt, engaged.get(0).get("unhealthy_clusters"), brakePages, released, startedAfter.size() - startedBefore, maxActive, FLEET_CAP);
    }
}
