package dev.tend.shared.wire;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import dev.tend.shared.SignalState;
import dev.tend.shared.TopologyChange;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.WireEvent;
import org.junit.jupiter.api.Test;

import java.io.StringReader;
import java.math.BigInteger;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class WireReaderTest {
    static final String TRANSITION =
            "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"storage-full\",\"state\":\"breach\",\"detail\":{\"used_pct\":97.5}}";
    private static final String TOPOLOGY =
            "{\"at\":\"2027-03-14T00:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n4\",\"topology\":\"joined\",\"attrs\":{\"zone\":\"z-b\"}}";

    private static WireEvent event(String line) {
        LineResult r = WireReader.of("events.jsonl").parseLine(line, 1);
        assertThat(r).as("result of %s", line).isInstanceOf(LineResult.Event.class);
        return ((LineResult.Event) r).event();
    }

    @Test
    void readsTheHealthTransitionOfTheDesign() {
        HealthTransition t = (HealthTransition) event(TRANSITION);
        assertThat(t.at()).isEqualTo(Instant.parse("2027-03-14T02:17:00Z"));
        assertThat(t.cluster()).isEqualTo(Id.of("fares-3"));
        assertThat(t.node()).isEqualTo(Id.of("n2"));
        assertThat(t.signal()).isEqualTo(Id.of("storage-full"));
        assertThat(t.state()).isEqualTo(SignalState.BREACH);
        assertThat(t.detail()).isEqualTo(Map.of("used_pct", 97.5));
        assertThat(t.extra()).isEmpty();
    }

    @Test
    void readsTheTopologyEventOfTheDesign() {
        TopologyEvent e = (TopologyEvent) event(TOPOLOGY);
        assertThat(e.at()).isEqualTo(Instant.parse("2027-03-14T00:00:00Z"));
        assertThat(e.cluster()).isEqualTo(Id.of("fares-3"));
        assertThat(e.node()).isEqualTo(Id.of("n4"));
        assertThat(e.change()).isEqualTo(TopologyChange.JOINED);
        assertThat(e.zone()).isEqualTo("z-b");
    }

    @Test
    void readsAClusterLevelTransitionWhenNodeIsAbsentOrNull() {
        HealthTransition absent = (HealthTransition) event(
                "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"signal\":\"key-revoked\",\"state\":\"breach\"}");
        HealthTransition nul = (HealthTransition) event(
                "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"node\":null,\"signal\":\"key-revoked\",\"state\":\"breach\"}");
        assertThat(absent.isClusterLevel()).isTrue();
        assertThat(absent.detail()).isEmpty();
        assertThat(nul).isEqualTo(absent);
    }

    @Test
    void readsFieldsInAnyOrderWithWhitespaceAndAnyZone() {
        HealthTransition t = (HealthTransition) event(
                "  { \"state\" : \"silent\", \"signal\":\"heartbeat\", \"node\":\"n1\", \"cluster\":\"dispatch-1\","
                        + " \"at\":\"2027-03-14t03:17:00.25+01:00\", \"detail\": null }  ");
        assertThat(t.at()).isEqualTo(Instant.parse("2027-03-14T02:17:00.250Z"));
        assertThat(t.state()).isEqualTo(SignalState.SILENT);
        assertThat(t.detail()).isEmpty();
    }

    @Test
    void readsATopologyEventWithoutAttrs() {
        TopologyEvent e = (TopologyEvent) event(
                "{\"at\":\"2027-03-14T00:00:00Z\",\"cluster\":\"tickets-12\",\"node\":\"n7\",\"topology\":\"left\"}");
        assertThat(e.change()).isEqualTo(TopologyChange.LEFT);
        assertThat(e.attrs()).isEmpty();
        assertThat(e.zone()).isNull();
    }

    @Test
    void keepsUnknownFieldsInLineOrderAsPlainJsonValues() {
        HealthTransition t = (HealthTransition) event("{\"source\":\"probe-7\",\"at\":\"2027-03-14T02:17:00Z\","
                + "\"cluster\":\"fares-3\",\"signal\":\"lag\",\"state\":\"clear\",\"seq\":12,\"big\":123456789012,"
                + "\"huge\":123456789012345678901234567890,\"ratio\":0.25,\"ok\":true,\"none\":null,"
                + "\"tags\":[\"a\",{\"b\":[1,2]}],\"attrs\":{\"zone\":\"z-a\"}}");
        assertThat(t.extra().keySet()).containsExactly("source", "seq", "big", "huge", "ratio", "ok", "none", "tags", "attrs");
        assertThat(t.extra().get("source")).isEqualTo("probe-7");
        assertThat(t.extra().get("seq")).isEqualTo(12);
        assertThat(t.extra().get("big")).isEqualTo(123456789012L);
        assertThat(t.extra().get("huge")).isEqualTo(new BigInteger("123456789012345678901234567890"));
        assertThat(t.extra().get("ratio")).isEqualTo(0.25);
        assertThat(t.extra().get("ok")).isEqualTo(true);
        assertThat(t.extra()).containsEntry("none", null);
        assertThat(t.extra().get("tags")).isEqualTo(List.of("a", Map.of("b", List.of(1, 2))));
        assertThat(t.extra().get("attrs")).as("attrs means nothing on a transition").isEqualTo(Map.of("zone", "z-a"));
    }

    @Test
    void keepsAStateFieldOfATopologyEventAsExtra() {
        TopologyEvent e = (TopologyEvent) event(
                "{\"at\":\"2027-03-14T00:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n4\",\"topology\":\"changed\",\"state\":\"draining\"}");
        assertThat(e.extra()).isEqualTo(Map.of("state", "draining"));
    }

    @Test
    void recognisesTheHeaderWithItsOptionalFields() {
        LineResult r = WireReader.of("night.jsonl").parseLine("{\"recording\":\"fares-3 disk night\",\"fleet\":\"larkspur.yaml\","
                + "\"from\":\"2027-03-14T00:00:00Z\",\"until\":\"2027-03-14T06:00:00Z\",\"description\":\"invented demo data\","
                + "\"recorded_by\":\"tend record\"}", 1);
        assertThat(r).isEqualTo(new LineResult.Header(new RecordingHeader("fares-3 disk night", "larkspur.yaml", null,
                Instant.parse("2027-03-14T00:00:00Z"), Instant.parse("2027-03-14T06:00:00Z"), "invented demo data",
                Map.of("recorded_by", "tend record")), 1));
    }

    @Test
    void recognisesAHeaderWithOnlyANameOrAnInlineFleet() {
        WireReader reader = WireReader.of("night.jsonl");
        assertThat(reader.parseLine("{\"recording\":\"quiet\"}", 1))
                .isEqualTo(new LineResult.Header(RecordingHeader.of("quiet"), 1));
        LineResult inline = WireReader.of("night.jsonl").parseLine(
                "{\"recording\":\"inline\",\"fleet\":{\"fleet\":\"larkspur\",\"clusters\":[{\"id\":\"fares-3\"}]}}", 1);
        RecordingHeader h = ((LineResult.Header) inline).header();
        assertThat(h.hasInlineFleet()).isTrue();
        assertThat(h.fleet()).isNull();
        assertThat(h.inlineFleet()).isEqualTo(Map.of("fleet", "larkspur", "clusters", List.of(Map.of("id", "fares-3"))));
    }

    @Test
    void acceptsAHeaderAfterBlankLinesButNotAfterAnEvent() {
        List<LineResult> results = readAll("\n{\"recording\":\"r\"}\n" + TRANSITION + "\n{\"recording\":\"again\"}\n");
        assertThat(results).extracting(LineResult::getClass).containsExactly(
                LineResult.Blank.class, LineResult.Header.class, LineResult.Event.class, LineResult.Bad.class);
        assertThat(((LineResult.Bad) results.get(3)).problem().toString()).isEqualTo(
                "night.jsonl:4:14: a recording header must come before the first event (line 3)");
    }

    @Test
    void rejectsASecondHeader() {
        List<LineResult> results = readAll("{\"recording\":\"r\"}\n{\"recording\":\"r2\"}\n");
        assertThat(((LineResult.Bad) results.get(1)).problem().toString())
                .isEqualTo("night.jsonl:2:14: a recording has one header; the first is at line 1");
    }

    @Test
    void handsOnEveryGoodLineAroundBadOnesInLineOrder() {
        String text = String.join("\n",
                TRANSITION,
                "{broken",
                TOPOLOGY,
                "",
                "{\"at\":\"2027-03-14T02:18:00Z\",\"cluster\":\"fares 3\",\"signal\":\"lag\",\"state\":\"breach\"}",
                TRANSITION.replace("breach", "clear"),
                "[]") + "\n";
        List<LineResult> results = new ArrayList<>();
        ReadSummary summary = WireReader.of("events.jsonl").readAll(new StringReader(text), results::add);
        assertThat(results).extracting(LineResult::line).containsExactly(1L, 2L, 3L, 4L, 5L, 6L, 7L);
        assertThat(results).extracting(LineResult::getClass).containsExactly(LineResult.Event.class,
                LineResult.Bad.class, LineResult.Event.class, LineResult.Blank.class, LineResult.Bad.class,
                LineResult.Event.class, LineResult.Bad.class);
        assertThat(((HealthTransition) ((LineResult.Event) results.get(5)).event()).state()).isEqualTo(SignalState.CLEAR);
        assertThat(summary).isEqualTo(new ReadSummary(7, 3, 0, 1, 3, summary.problems(), 0));
        assertThat(summary.problems()).extracting(Problem::line).containsExactly(2, 5, 7);
        assertThat(summary.problems().get(1).toString()).isEqualTo("events.jsonl:5:40: field 'cluster': 'fares 3' is not an id:"
                + " use letters, digits and . _ : - only, starting with a letter or digit");
        assertThat(summary.isClean()).isFalse();
    }

    @Test
    void passesLateAndOutOfOrderLinesOnInLineOrder() {
        String late = TRANSITION.replace("02:17:00Z", "01:00:00Z").replace("breach", "clear");
        String later = TRANSITION.replace("02:17:00Z", "03:00:00Z");
        List<LineResult> results = readAll(later + "\n" + TRANSITION + "\n" + late + "\n");
        assertThat(results).extracting(r -> ((LineResult.Event) r).event().at()).containsExactly(
                Instant.parse("2027-03-14T03:00:00Z"), Instant.parse("2027-03-14T02:17:00Z"), Instant.parse("2027-03-14T01:00:00Z"));
    }

    @Test
    void handsEachLineToTheSinkBeforeReadingTheNext() {
        List<String> lines = List.of(TRANSITION, "nonsense", TOPOLOGY, "");
        List<LineResult> received = new ArrayList<>();
        List<Integer> receivedWhenAsked = new ArrayList<>();
        java.io.Reader live = new java.io.Reader() {
            private int next;

            @Override
            public int read(char[] buf, int off, int len) {
                receivedWhenAsked.add(received.size());
                if (next == lines.size()) return -1;
                char[] chunk = (lines.get(next++) + "\n").toCharArray();
                if (chunk.length > len) throw new IllegalStateException("test lines fit the reader's buffer");
                System.arraycopy(chunk, 0, buf, off, chunk.length);
                return chunk.length;
            }

            @Override
            public void close() {
            }
        };
        ReadSummary summary = WireReader.of("-").readAll(live, received::add);
        assertThat(receivedWhenAsked).containsExactly(0, 1, 2, 3, 4);
        assertThat(summary.lines()).isEqualTo(4);
        assertThat(((LineResult.Bad) received.get(1)).problem().source()).isEqualTo("-");
    }

    @Test
    void keepsTheFirstThousandProblemsAndCountsTheRest() {
        StringBuilder text = new StringBuilder(TRANSITION).append('\n');
        for (int i = 0; i < 1005; i++) text.append("{}\n");
        text.append(TOPOLOGY).append('\n');
        List<LineResult> results = new ArrayList<>();
        ReadSummary summary = WireReader.of("events.jsonl").readAll(new StringReader(text.toString()), results::add);
        assertThat(results).hasSize(1007);
        assertThat(summary.lines()).isEqualTo(1007);
        assertThat(summary.events()).isEqualTo(2);
        assertThat(summary.bad()).isEqualTo(1005);
        assertThat(summary.problems()).hasSize(WireReader.MAX_PROBLEMS_KEPT);
        assertThat(summary.problems().get(999).line()).isEqualTo(1001);
        assertThat(summary.problemsOmitted()).isEqualTo(5);
    }

    @Test
    void parsesIndependentLinesFromSeveralThreadsWithOneReader() throws Exception {
        WireReader shared = WireReader.of("journal");
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(4);
        try {
            List<java.util.concurrent.Future<List<String>>> results = new ArrayList<>();
            for (int t = 0; t < 4; t++) {
                String cluster = "tickets-" + t;
                results.add(pool.submit(() -> {
                    List<String> wrong = new ArrayList<>();
                    for (int i = 0; i < 5_000; i++) {
                        String line = "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"" + cluster + "\",\"node\":\"n" + i
                                + "\",\"signal\":\"lag\",\"state\":\"breach\",\"detail\":{\"i\":" + i + "}}";
                        LineResult r = shared.parseLine(line, i + 1);
                        HealthTransition h = r instanceof LineResult.Event e ? (HealthTransition) e.event() : null;
                        if (h == null || !h.cluster().value().equals(cluster) || !h.node().value().equals("n" + i)
                                || !h.detail().get("i").equals(i)) {
                            wrong.add(line + " -> " + r);
                        }
                    }
                    return wrong;
                }));
            }
            for (java.util.concurrent.Future<List<String>> f : results) assertThat(f.get()).isEmpty();
        } finally {
            pool.shutdownNow();
        }
    }

    @Test
    void readsCrLfLinesAndSkipsAByteOrderMark() {
        List<LineResult> results = readAll("\uFEFF" + TRANSITION + "\r\n" + TOPOLOGY + "\r\n");
        assertThat(results).allMatch(r -> r instanceof LineResult.Event);
        assertThat(results).hasSize(2);
    }

    @Test
    void countsAnEmptyInputAsCleanAndEmpty() {
        ReadSummary summary = WireReader.of("-").readAll(new StringReader(""), r -> {
            throw new AssertionError("no line, no result");
        });
        assertThat(summary).isEqualTo(new ReadSummary(0, 0, 0, 0, 0, List.of(), 0));
        assertThat(summary.isClean()).isTrue();
    }

    @Test
    void summaryRefusesCountsThatDoNotAddUp() {
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> new ReadSummary(3, 1, 0, 0, 1, List.of(), 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("lines (3) must equal events + headers + blanks + bad (2)");
    }

    private static List<LineResult> readAll(String text) {
        List<LineResult> results = new ArrayList<>();
        WireReader.of("night.jsonl").readAll(new StringReader(text), results::add);
        return results;
    }

    @Test
    void readsBytesLineByLineAndRefusesOnlyTheLineThatIsNotUtf8AtItsFirstWrongByte() {
        String good = "{\"at\":\"2027-03-14T02:00:00Z\",\"cluster\":\"fares-3\",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
        java.io.ByteArrayOutputStream b = new java.io.ByteArrayOutputStream();
        b.writeBytes(new byte[]{(byte) 0xEF, (byte) 0xBB, (byte) 0xBF}); // a byte order mark, skipped
        b.writeBytes((good + "\r\n").getBytes(java.nio.charset.StandardCharsets.UTF_8));
        b.writeBytes("{\"at\":\"".getBytes(java.nio.charset.StandardCharsets.UTF_8));
        b.writeBytes(new byte[]{(byte) 0xC3, (byte) 0x28, '\n'}); // 0xC3 must be followed by a continuation byte (RFC 3629, section 4)
        b.writeBytes((good.replace("fares-3", "f\u00e4res-3") + "\n").getBytes(java.nio.charset.StandardCharsets.UTF_8));
        b.writeBytes(good.getBytes(java.nio.charset.StandardCharsets.UTF_8)); // no line break at the end
        List<LineResult> results = new ArrayList<>();
        ReadSummary s = WireReader.of("in.jsonl").readAll(new java.io.ByteArrayInputStream(b.toByteArray()), results::add);
        assertThat(s.lines()).isEqualTo(4);
        assertThat(s.events()).isEqualTo(2);
        assertThat(s.bad()).isEqualTo(2);
        Problem p = s.problems().get(0);
        assertThat(p.line()).isEqualTo(2);
        assertThat(p.column()).isEqualTo(8);
        assertThat(p.message()).contains("not valid UTF-8");
        assertThat(s.problems().get(1).line()).as("valid UTF-8 that is not an id is refused for the id").isEqualTo(3);
        assertThat(s.problems().get(1).field()).isEqualTo("cluster");
    }
}
