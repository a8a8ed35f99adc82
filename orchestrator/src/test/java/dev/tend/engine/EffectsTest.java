package dev.tend.engine;

import dev.tend.shared.Id;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class EffectsTest {
    @Test
    void aLedgerEntryKeepsEveryFieldGivenAValueAndLeavesOutTheNullOnes() {
        for (int pairs = 0; pairs <= 14; pairs++) {
            for (int nullAt = -1; nullAt < pairs; nullAt++) {
                List<Object> kv = new ArrayList<>();
                Map<String, Object> expected = new LinkedHashMap<>();
                for (int i = 0; i < pairs; i++) {
                    Object v = i == nullAt ? null : i % 3 == 0 ? Id.of("fares-" + i) : i % 3 == 1 ? "text " + i : (Object) (long) i;
                    kv.add("field_" + i);
                    kv.add(v);
                    if (v != null) expected.put("field_" + i, v instanceof Id id ? id.value() : v);
                }
                assertThat(Effects.fields(kv.toArray())).as("%d pairs, null at %d", pairs, nullAt).isEqualTo(expected);
            }
        }
    }

    @Test
    void aLedgerEntryWritesTimesAsTheWireDoes() {
        Effects fx = new Effects(Instant.parse("2027-03-01T00:00:00Z"));
        fx.ledger(LedgerKind.TOPOLOGY, "cluster", Id.of("fares-3"), "node", Id.of("n2"), "change", "joined",
                "at_event", Instant.parse("2027-03-01T00:00:01.500Z"));
        Effect.Ledger l = (Effect.Ledger) fx.list().get(0);
        assertThat(l.fields()).isEqualTo(Map.of("cluster", "fares-3", "node", "n2", "change", "joined",
                "at_event", "2027-03-01T00:00:01.500Z"));
    }
}
