package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The journal's compact lines: every line {@link WireWriter} writes for a transition or a
 * topology event comes back byte for byte from its compact form, its time and its cluster, and
 * what is not such a line is left as it is.
 */
class CompactLineTest {
    @Test
    void everyWrittenLineComesBackWholeFromItsCompactFormItsTimeAndItsCluster() {
        for (WireEvent e : events()) {
            String line = WireWriter.line(e);
            String compact = CompactLine.of(line);
            assertThat(CompactLine.isCompact(compact)).as(line).isTrue();
            assertThat(compact).as("never taken for a whole line").doesNotStartWith("{");
            assertThat(compact.length()).as(line).isLessThan(line.length() - "{\"at\":\"0000-01-01T00:00:00Z\",\"cluster\":\"".length());
            assertThat(CompactLine.whole(compact, e.at(), e.cluster().value())).isEqualTo(line);
            // and the compact line read back is the event: the journal's decoder reads the whole line
            LineResult read = WireReader.trusted("journal").parseLine(CompactLine.whole(compact, e.at(), e.cluster().value()), 1);
            assertThat(((LineResult.Event) read).event()).isEqualTo(e);
        }
    }

    @Test
    void whatIsNotAWrittenEventLineIsLeftAsItIs() {
        String header = WireWriter.line(RecordingHeader.of("larkspur-night").withFleet("fleet.yaml"));
        String reordered = "{\"cluster\":\"fares-3\",\"at\":\"2027-03-14T02:17:00Z\",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        String clusterOnly = "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\"}";
        for (String other : List.of(header, reordered, clusterOnly, "{\"key\":\"recheck:p/fares-3/n2\"}", "{}", "")) {
            assertThat(CompactLine.of(other)).isSameAs(other);
            assertThat(CompactLine.whole(other, Instant.EPOCH, "fares-3")).isSameAs(other);
        }
        String compact = ",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        assertThat(CompactLine.whole(compact, null, "fares-3")).as("nothing to make it whole with").isSameAs(compact);
    }

    private static List<WireEvent> events() {
        List<WireEvent> out = new ArrayList<>();
        // times at the edges RFC 3339 can write (section 5.6: years 0000 to 9999), and fractions of 1 to 9 digits
        List<Instant> times = new ArrayList<>(List.of(Instant.parse("0000-01-01T00:00:00Z"), Instant.parse("9999-12-31T23:59:59.999999999Z"),
                Instant.parse("2027-03-14T02:17:00Z"), Instant.parse("2027-03-28T01:00:00.5Z")));
        for (int digits = 1; digits <= 9; digits++) times.add(Instant.parse("2026-03-15T00:00:00Z").plusNanos((long) Math.pow(10, 9 - digits) * 7));
        Map<String, Object> detail = new LinkedHashMap<>();
        detail.put("used_pct", 97.5);
        detail.put("mount", "/var/lib/fares \"data\"");
        for (Instant at : times) {
            out.add(HealthTransition.of(at, "fares-3", "n2", "storage-full", SignalState.BREACH));
            out.add(HealthTransition.of(at, "dispatch-1", null, "quorum-lost", SignalState.CLEAR));
            out.add(new HealthTransition(at, Id.of("fares-3"), Id.of("n4"), Id.of("heartbeat"), SignalState.SILENT, detail,
                    Map.of("source", "probe-7")));
            out.add(new TopologyEvent(at, Id.of("dispatch-1"), Id.of("n5"), TopologyChange.JOINED, Map.of("zone", "east"), Map.of()));
            out.add(new TopologyEvent(at, Id.of("dispatch-1"), Id.of("n5"), TopologyChange.LEFT, Map.of(), Map.of()));
        }
        return out;
    }
}
