package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.util.Arrays;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class LedgerKindTest {
    @Test
    void everyKindIsFoundByTheNameTheLedgerStores() {
        for (LedgerKind k : LedgerKind.values()) assertThat(LedgerKind.of(k.wire())).contains(k);
        assertThat(Arrays.stream(LedgerKind.values()).map(LedgerKind::wire)).doesNotHaveDuplicates();
        assertThat(LedgerKind.of("run-begun")).isEmpty();
    }

    @Test
    void anEntryWithAFieldItsKindDoesNotDeclareFailsWhenAssertionsAreOn() {
        assertThat(LedgerKind.RUN_STARTED.check(Map.of("run", "r000001", "playbook", "p"))).containsKey("run");
        assertThatThrownBy(() -> new Effect.Ledger(LedgerKind.RUN_STARTED, Map.of("run", "r000001", "runner", "x")))
                .isInstanceOf(AssertionError.class).hasMessageContaining("[runner]");
    }

    @Test
    void pagesCarryTheirFieldsIntoTheirLedgerEntries() {
        assertThat(LedgerKind.NOTIFICATION.fields()).contains("id", "page_kind", "message").containsAll(LedgerKind.pageFields());
        assertThat(LedgerKind.PAGE_FOLDED.fields()).contains("into", "sent").containsAll(LedgerKind.pageFields());
    }
}
