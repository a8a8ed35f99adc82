package dev.tend.engine;

import dev.tend.store.LedgerDraft;
import org.junit.jupiter.api.Test;

import java.time.Duration;

import static dev.tend.engine.EngineHarness.cluster;
import static dev.tend.engine.EngineHarness.fleet;
import static dev.tend.engine.EngineHarness.replacePlaybook;
import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatCode;

class LedgerFieldsTest {
    @Test
    void aWaitHealthyStepThatMustWaitLedgersFieldsTheStoreAccepts() {
        EngineHarness h = new EngineHarness(fleet(cluster("fares-3", "standard", 3, null)), null, replacePlaybook("0s", ""));
        h.at(0, "fares-3", "n2", "heartbeat", SILENT);
        h.advance(Duration.ofSeconds(30));
        h.answerCalls(true);                   // drain done
        h.advance(Duration.ofSeconds(30));
        h.calls.clear();                       // replace answered without clearing: the settle step has to wait
        h.send(new Input.ExecutorResult("r000001", "replace", 1, true, "ok", java.util.List.of(), java.util.Map.of()));
        assertThat(h.ledger("step-started")).singleElement().satisfies(f -> assertThat(f).containsEntry("step", "settle"));
        for (Effect e : h.effects) {
            if (e instanceof Effect.Ledger l) {
                assertThatCode(() -> new LedgerDraft(h.now, l.kind(), l.fields())).as(l.kind()).doesNotThrowAnyException();
            }
        }
    }
}
