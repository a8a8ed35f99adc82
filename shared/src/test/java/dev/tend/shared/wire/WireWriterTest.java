package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.IOException;
import java.io.StringReader;
import java.io.StringWriter;
import java.io.Writer;
import java.math.BigInteger;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class WireWriterTest {
    private static final Instant AT = Instant.parse("2027-03-14T02:17:00Z");

    @ParameterizedTest
    @ValueSource(strings = {
            // the two examples of DESIGN.md section 3, already in the writer's field order
            "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"storage-full\",\"state\":\"breach\",\"detail\":{\"used_pct\":97.5}}",
            "{\"at\":\"2027-03-14T00:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n4\",\"topology\":\"joined\",\"attrs\":{\"zone\":\"z-b\"}}",
            "{\"at\":\"2027-03-14T02:17:00.25Z\",\"cluster\":\"fares-3\",\"signal\":\"key-revoked\",\"state\":\"silent\",\"probe\":\"p-7\",\"n\":[1,2.5,null,true,{\"k\":\"v\"}]}",
            "{\"recording\":\"night of the full disks\",\"fleet\":\"larkspur.yaml\",\"from\":\"2027-03-14T00:00:00Z\",\"until\":\"2027-03-14T06:00:00Z\",\"description\":\"invented demo data\",\"by\":\"tend\"}",
            "{\"recording\":\"inline\",\"fleet\":{\"fleet\":\"larkspur\",\"clusters\":[{\"id\":\"fares-3\",\"quorum\":true}]}}",
    })
    void writesBackTheLineItReadWhenItIsInFieldOrder(String line) {
        LineResult r = WireReader.of("t").parseLine(line, 1);
        String written = r instanceof LineResult.Header h ? WireWriter.line(h.header()) : WireWriter.line(((LineResult.Event) r).event());
        assertThat(written).isEqualTo(line);
    }

    @Test
    void aTransitionWithoutDetailOrExtraFieldsIsWrittenAsTheJsonGeneratorWritesIt() {
        java.util.SplittableRandom random = new java.util.SplittableRandom(3);
        String[] ids = {"fares-3", "a", "Z9", "dispatch.east_1:x-2", "n" + "0".repeat(60)};
        for (int i = 0; i < 2000; i++) {
            Instant at = Instant.ofEpochSecond(random.nextLong(0, 7_000_000_000L), random.nextInt(4) == 0 ? 0 : random.nextInt(1_000_000_000));
            String node = random.nextBoolean() ? null : ids[random.nextInt(ids.length)];
            HealthTransition t = HealthTransition.of(at, ids[random.nextInt(ids.length)], node, ids[random.nextInt(ids.length)],
                    SignalState.values()[random.nextInt(SignalState.values().length)]);
            assertThat(WireWriter.line(t)).isEqualTo(WireWriter.generated(t));
            assertThat(((LineResult.Event) WireReader.of("t").parseLine(WireWriter.line(t), 1)).event()).isEqualTo(t);
        }
    }

    @Test
    void writesFieldsInTheFixedOrderWhateverTheOrderRead() {
        WireEvent e = ((LineResult.Event) WireReader.of("t").parseLine("{\"z\":1,\"detail\":{\"b\":1,\"a\":2},\"state\":\"clear\","
                + "\"signal\":\"lag\",\"node\":\"n1\",\"cluster\":\"dispatch-1\",\"at\":\"2027-03-14T03:17:00+01:00\",\"a\":2}", 1)).event();
        assertThat(WireWriter.line(e)).isEqualTo("{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"dispatch-1\",\"node\":\"n1\","
                + "\"signal\":\"lag\",\"state\":\"clear\",\"detail\":{\"b\":1,\"a\":2},\"z\":1,\"a\":2}");
    }

    @Test
    void leavesOutAnAbsentNodeAndEmptyDetailOrAttrs() {
        assertThat(WireWriter.line(HealthTransition.of(AT, "fares-3", null, "key-revoked", SignalState.BREACH)))
                .isEqualTo("{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"signal\":\"key-revoked\",\"state\":\"breach\"}");
        assertThat(WireWriter.line(new TopologyEvent(AT, Id.of("fares-3"), Id.of("n4"), TopologyChange.LEFT, Map.of(), Map.of())))
                .isEqualTo("{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"node\":\"n4\",\"topology\":\"left\"}");
        assertThat(WireWriter.line(RecordingHeader.of("quiet"))).isEqualTo("{\"recording\":\"quiet\"}");
    }

    @Test
    void readsBackEqualEventsFromEverythingItWrites() {
        Map<String, Object> detail = new LinkedHashMap<>();
        detail.put("used_pct", 97.5);
        detail.put("count", 3);
        detail.put("bytes", 12_000_000_000L);
        detail.put("huge", new BigInteger("123456789012345678901234567890"));
        detail.put("tiny", 5e-324);
        detail.put("neg_zero", -0.0);
        detail.put("text", "quote \" backslash \\ tab \t nul \u0000 euro \u20ac emoji \ud83d\ude00");
        detail.put("nothing", null);
        detail.put("list", List.of(1, "two", List.of(), Map.of()));
        Map<String, Object> extra = new LinkedHashMap<>();
        extra.put("probe", "p-7");
        extra.put("nested", Map.of("deep", Map.of("deeper", List.of(true, false))));
        RecordingHeader header = new RecordingHeader("fares-3 night", null, Map.of("fleet", "larkspur"),
                Instant.parse("1999-12-31T00:00:00Z"), Instant.parse("2027-03-14T06:00:00.5Z"), "invented", Map.of("v", 1));
        List<WireEvent> events = List.of(
                new HealthTransition(Instant.parse("2027-03-14T02:17:00.123456789Z"), Id.of("fares-3"), Id.of("n2"),
                        Id.of("storage-full"), SignalState.BREACH, detail, extra),
                new HealthTransition(Instant.parse("1999-12-31T23:59:59.999Z"), Id.of("tickets-12"), null,
                        Id.of("key-revoked"), SignalState.CLEAR, Map.of(), Map.of()),
                new HealthTransition(Instant.parse("2027-03-14T02:17:00Z"), Id.of("A" + "b".repeat(127)), Id.of("n:1_x.y-z"),
                        Id.of("heartbeat"), SignalState.SILENT, Map.of(), Map.of("attrs", Map.of("zone", "z-a"))),
                new TopologyEvent(AT, Id.of("fares-3"), Id.of("n4"), TopologyChange.CHANGED, Map.of("zone", "z-c", "rack", 4),
                        Map.of("state", "draining", "detail", "moved")));

        StringWriter out = new StringWriter();
        WireWriter writer = WireWriter.to(out);
        writer.writeHeader(header);
        events.forEach(writer::write);
        writer.flush();

        List<LineResult> results = new ArrayList<>();
        ReadSummary summary = WireReader.of("round-trip").readAll(new StringReader(out.toString()), results::add);
        assertThat(summary.isClean()).as("problems: %s", summary.problems()).isTrue();
        assertThat(out.toString()).endsWith("\n").doesNotContain("\n\n");
        assertThat(((LineResult.Header) results.get(0)).header()).isEqualTo(header);
        assertThat(results.subList(1, results.size())).extracting(r -> ((LineResult.Event) r).event()).isEqualTo(events);
    }

    @Test
    void refusesNumbersJsonCannotCarry() {
        HealthTransition nan = new HealthTransition(AT, Id.of("fares-3"), null, Id.of("lag"), SignalState.BREACH,
                Map.of("ratio", Double.NaN), Map.of());
        assertThatThrownBy(() -> WireWriter.line(nan))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("field 'detail' holds NaN, which is not a JSON number");
        HealthTransition inf = new HealthTransition(AT, Id.of("fares-3"), null, Id.of("lag"), SignalState.BREACH,
                Map.of(), Map.of("rate", Double.POSITIVE_INFINITY));
        assertThatThrownBy(() -> WireWriter.line(inf))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("field 'rate' holds Infinity, which is not a JSON number");
    }

    @Test
    void refusesExtraFieldsThatWouldChangeTheLinesMeaning() {
        assertThatThrownBy(() -> new HealthTransition(AT, Id.of("fares-3"), null, Id.of("lag"), SignalState.BREACH,
                Map.of(), Map.of("topology", "joined")))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("extra must not hold 'topology': wire format v1 gives it a meaning");
        assertThatThrownBy(() -> new TopologyEvent(AT, Id.of("fares-3"), Id.of("n4"), TopologyChange.JOINED,
                Map.of(), Map.of("at", "then")))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("extra must not hold 'at': wire format v1 gives it a meaning");
        assertThatThrownBy(() -> new RecordingHeader("r", null, null, null, null, null, Map.of("from", "x")))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("extra must not hold 'from', a header field");
    }

    @Test
    void recordingHeaderValidatesItsFields() {
        assertThatThrownBy(() -> RecordingHeader.of(" "))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("recording (the name) must not be blank");
        assertThatThrownBy(() -> RecordingHeader.of("r".repeat(257)))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("recording (the name) is at most 256 characters, got 257");
        assertThatThrownBy(() -> RecordingHeader.of("r").withPeriod(AT, AT.minusSeconds(1)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("until (2027-03-14T02:16:59Z) is before from (2027-03-14T02:17:00Z)");
        assertThatThrownBy(() -> new RecordingHeader("r", "a.yaml", Map.of(), null, null, null, null))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a recording header names its fleet once: a path or inline, not both");
        assertThatThrownBy(() -> RecordingHeader.of("r").withFleet(""))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("fleet (a path) must not be blank");
    }

    @Test
    void reportsAFailingOutputAsAWireWriteException() {
        Writer broken = new Writer() {
            @Override
            public void write(char[] buf, int off, int len) throws IOException {
                throw new IOException("disk full");
            }

            @Override
            public void flush() {
            }

            @Override
            public void close() {
            }
        };
        assertThatThrownBy(() -> WireWriter.to(broken).write(HealthTransition.of(AT, "fares-3", "n2", "lag", SignalState.CLEAR)))
                .isInstanceOf(WireWriteException.class)
                .isInstanceOf(dev.tend.shared.TendException.class)
                .hasMessage("cannot write the wire output: disk full");
    }
}
