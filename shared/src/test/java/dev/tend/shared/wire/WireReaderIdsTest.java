package dev.tend.shared.wire;

import dev.tend.shared.CanonicalEvents;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class WireReaderIdsTest {
    /** Plain lines (the fast path), a line with a detail and one pretty-printed field order (the general way), a topology event. */
    private static final String LINES = String.join("\n",
            "{\"at\":\"2027-03-01T00:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n1\",\"signal\":\"process-down\",\"state\":\"breach\"}",
            "{\"at\":\"2027-03-01T00:00:01Z\",\"cluster\":\"fares-3\",\"node\":\"n1\",\"signal\":\"process-down\",\"state\":\"clear\"}",
            "{\"state\":\"breach\",\"signal\":\"process-down\",\"cluster\":\"fares-3\",\"node\":\"n1\",\"at\":\"2027-03-01T00:00:02Z\",\"detail\":{\"pid\":\"gone\"}}",
            "{\"at\":\"2027-03-01T00:00:03Z\",\"cluster\":\"dispatch-1\",\"node\":\"n2\",\"topology\":\"joined\",\"attrs\":{\"zone\":\"z-b\"}}",
            "");

    private static List<WireEvent> read(WireReader reader) {
        List<WireEvent> events = new ArrayList<>();
        reader.readAll(new ByteArrayInputStream(LINES.getBytes(StandardCharsets.UTF_8)), r -> {
            if (r instanceof LineResult.Event e) events.add(e.event());
        });
        return events;
    }

    @Test
    void everyEventCarriesTheInstancesTheCanonicalIdsGiveOnEveryPath() {
        CanonicalEvents canonical = new CanonicalEvents();
        Id fares3 = Id.of("fares-3");
        Id n1 = Id.of("n1");
        canonical.know(fares3);
        canonical.know(n1);

        List<WireEvent> events = read(WireReader.of("e.jsonl").withIds(canonical));

        assertThat(events).hasSize(4);
        for (int i = 0; i < 3; i++) {
            HealthTransition t = (HealthTransition) events.get(i);
            assertThat(t.cluster()).isSameAs(fares3);
            assertThat(t.node()).isSameAs(n1);
            assertThat(t.signal()).isSameAs(canonical.canonical("process-down"));
        }
        TopologyEvent joined = (TopologyEvent) events.get(3);
        assertThat(joined.cluster()).isSameAs(canonical.canonical("dispatch-1"));
        assertThat(joined.node()).isSameAs(canonical.canonical("n2"));
    }

    @Test
    void theEventsAreEqualToThoseOfAReaderWithItsOwnIds() {
        CanonicalEvents canonical = new CanonicalEvents();
        assertThat(read(WireReader.of("e.jsonl").withIds(canonical))).isEqualTo(read(WireReader.of("e.jsonl")));
    }
}
