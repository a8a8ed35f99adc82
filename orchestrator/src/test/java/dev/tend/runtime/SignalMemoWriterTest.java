package dev.tend.runtime;

import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.module.SimpleModule;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.HealthMemo;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** Format 2's signals: written as compact arrays with instants as seconds, and read back exactly. */
class SignalMemoWriterTest {
    private final ObjectMapper format2 = SnapshotCodec.recordMapper(SnapshotCodec.textModule())
            .registerModule(new SimpleModule("signals").addSerializer(HealthMemo.Signal.class, new SignalMemoWriter())
                    .addDeserializer(HealthMemo.Signal.class, new SignalMemoReader()))
            .enable(DeserializationFeature.USE_BIG_DECIMAL_FOR_FLOATS);

    private static final Instant T = Instant.parse("2027-03-14T02:17:00Z");

    @Test
    void aSignalIsAnArrayWithItsInstantsAsSecondsToTheNanosecond() throws Exception {
        HealthMemo.Signal s = new HealthMemo.Signal(new SignalKey(Id.of("fares-3"), Id.of("n1"), Id.of("heartbeat")),
                SignalState.SILENT, T, T.plusMillis(500), List.of(T.minusSeconds(90), T.plusNanos(1_500), T.plusNanos(7)));
        // 2027-03-14T02:17:00Z is 1,804,990,620 s after the epoch
        assertThat(format2.writeValueAsString(s)).isEqualTo("[\"fares-3\",\"n1\",\"heartbeat\",\"SILENT\",1804990620,1804990620.5,"
                + "[1804990530,1804990620.0000015,1804990620.000000007]]");
    }

    @Test
    void everySignalShapeReadsBackEqual() throws Exception {
        List<HealthMemo.Signal> signals = List.of(
                new HealthMemo.Signal(new SignalKey(Id.of("fares-3"), Id.of("n1"), Id.of("heartbeat")), SignalState.SILENT,
                        T, T.plusMillis(500), List.of(T.minusSeconds(90), T.plusNanos(1_500), T.plusNanos(7), T.plusNanos(999_999_999))),
                new HealthMemo.Signal(new SignalKey(Id.of("dispatch-1"), null, Id.of("replica-lag")), SignalState.CLEAR,
                        T.minusSeconds(3600), T, List.of()),
                new HealthMemo.Signal(new SignalKey(Id.of("dispatch-1"), Id.of("n2"), Id.of("cert-expiry")), SignalState.BREACH,
                        T, null, List.of(T)),
                // the epoch itself, and instants before it (written as text: a negative number's fraction would read the other way)
                new HealthMemo.Signal(new SignalKey(Id.of("depot-2"), Id.of("n9"), Id.of("storage-full")), null,
                        Instant.EPOCH, Instant.ofEpochSecond(-1, 250_000_000), List.of(Instant.parse("1969-07-20T20:17:40Z"))));
        for (HealthMemo.Signal s : signals) {
            String text = format2.writeValueAsString(s);
            assertThat(format2.readValue(text, HealthMemo.Signal.class)).as(text).isEqualTo(s);
            // read as the codec reads a snapshot: through a tree first
            assertThat(format2.treeToValue(format2.readTree(text), HealthMemo.Signal.class)).as(text).isEqualTo(s);
        }
        HealthMemo memo = new HealthMemo(signals, List.of(), List.of(), 2, 9);
        String text = format2.writeValueAsString(memo);
        assertThat(format2.treeToValue(format2.readTree(text), HealthMemo.class)).isEqualTo(memo);
    }

    @Test
    void aSignalThatIsNotAnArrayIsRefusedWithWhatWasExpected() {
        String formatOne = "{\"key\":{\"cluster\":\"fares-3\",\"node\":\"n1\",\"signal\":\"heartbeat\"},\"state\":\"SILENT\","
                + "\"since\":\"2027-03-14T02:17:00Z\",\"lastAt\":null,\"changes\":[]}";
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> format2.readValue(formatOne, HealthMemo.Signal.class))
                .hasMessageContaining("expected a signal (START_ARRAY), got START_OBJECT");
    }
}
