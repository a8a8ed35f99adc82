package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.time.Duration;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

class RateBudgetTest {
    private static final String TEND = """
            defaults: { fleet: 100, per-zone: 100, rate: 100/1h }
            rate: 5/1h
            brake: { engage-at: { clusters: 1000 }, release-below: { clusters: 500 } }
            """;

    @Test
    void fleetWideBudgetGrantsItsPermitsThenHoldsUntilAnHourAfterTheFirstStart() {
        StringBuilder clusters = new StringBuilder();
        for (int i = 1; i <= 10; i++) clusters.append(cluster("fares-" + i, "standard", 3, null));
        EngineHarness h = new EngineHarness(fleet(clusters.toString()), TEND, replacePlaybook("0s", "keep-replicas: false"));
        for (int i = 1; i <= 10; i++) h.at(i, "fares-" + i, "n1", "heartbeat", SILENT);
        assertThat(h.ledger("run-started")).hasSize(5);
        h.settle();
        h.advance(Duration.ofMinutes(61));
        h.settle();
        assertThat(h.ledger("run-started")).hasSize(10);
    }
}
