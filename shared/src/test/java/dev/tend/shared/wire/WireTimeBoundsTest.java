package dev.tend.shared.wire;

import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.StringReader;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class WireTimeBoundsTest {
    private static final Instant WALL = Instant.parse("2026-12-02T13:00:00Z");

    private static String line(String at) {
        return "{\"at\":\"" + at + "\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}";
    }

    private static List<LineResult> read(WireReader reader, String... lines) {
        List<LineResult> out = new ArrayList<>();
        reader.readAll(new StringReader(String.join("\n", lines)), out::add);
        return out;
    }

    private static Problem problem(LineResult r) {
        assertThat(r).isInstanceOf(LineResult.Bad.class);
        return ((LineResult.Bad) r).problem();
    }

    @Test
    void theBoundsAreTheStartOf1970AndTheEndOf2200() {
        // POSIX.1 (IEEE Std 1003.1, "Seconds Since the Epoch") puts second 0 at 1970-01-01T00:00:00Z;
        // 2201-01-01T00:00:00Z is 7,289,654,400 s after it (Python's calendar.timegm, a reference library)
        assertThat(WireReader.EARLIEST.getEpochSecond()).isZero();
        assertThat(WireReader.BEYOND.getEpochSecond()).isEqualTo(7_289_654_400L);
    }

    @Test
    void aLineDatedIn2261IsRefusedNamingLineAndFieldAndTheGoodLinesAroundItAreKept() {
        WireReader reader = WireReader.of("events.jsonl");
        List<LineResult> r = read(reader, line("2026-03-14T02:00:00Z"), line("2261-03-14T02:01:00Z"), line("2026-03-14T02:02:00Z"));
        assertThat(r.get(0)).isInstanceOf(LineResult.Event.class);
        assertThat(r.get(2)).isInstanceOf(LineResult.Event.class);
        Problem p = problem(r.get(1));
        assertThat(p.toString()).startsWith("events.jsonl:2:7: ");
        assertThat(p.field()).isEqualTo("at");
        assertThat(p.message()).contains("2261-03-14T02:01:00Z is after 2200");
        assertThat(reader.timeRefusals().get(TimeRefusal.AFTER_2200)).isEqualTo(1L);
    }

    @ParameterizedTest
    @ValueSource(strings = {"1969-12-31T23:59:59Z", "1970-01-01T00:59:59+01:00", "0001-01-01T00:00:00Z"})
    void timesBefore1970AreRefused(String at) {
        WireReader reader = WireReader.of("events.jsonl");
        assertThat(problem(read(reader, line(at)).get(0)).message()).contains("is before 1970");
        assertThat(reader.timeRefusals().get(TimeRefusal.BEFORE_1970)).isEqualTo(1L);
    }

    @ParameterizedTest
    @ValueSource(strings = {"1970-01-01T00:00:00Z", "2200-12-31T23:59:59.999999999Z", "2201-01-01T00:59:59+01:00"})
    void timesFrom1970ToTheEndOf2200AreAccepted(String at) {
        assertThat(read(WireReader.of("events.jsonl"), line(at)).get(0)).isInstanceOf(LineResult.Event.class);
    }

    @Test
    void aLiveInputRefusesALineMoreThanMaxSkewAheadOfItsClock() {
        WireReader reader = WireReader.of("-").withLiveClock(() -> WALL, Duration.ofMinutes(5));
        List<LineResult> r = read(reader, line("2026-12-02T13:05:00Z"), line("2026-12-02T13:05:01Z"), line("2026-12-01T13:00:00Z"),
                line("4027-12-02T13:00:00Z"));
        assertThat(r.get(0)).isInstanceOf(LineResult.Event.class);
        assertThat(problem(r.get(1)).message()).contains("is 5m1s ahead of this clock (2026-12-02T13:00:00Z)").contains("max-skew");
        assertThat(r.get(2)).as("the past is never too far behind").isInstanceOf(LineResult.Event.class);
        assertThat(problem(r.get(3)).message()).contains("after 2200");
        assertThat(reader.timeRefusals().get(TimeRefusal.AHEAD_OF_CLOCK)).isEqualTo(1L);
        assertThat(reader.timeRefusals().get(TimeRefusal.AFTER_2200)).isEqualTo(1L);
    }

    @Test
    void aLiveInputJudgesATimeBeyondItsLastReadingOfTheClockByTheClockNowAndReadsItOnlyNowAndThen() {
        java.util.concurrent.atomic.AtomicInteger reads = new java.util.concurrent.atomic.AtomicInteger();
        // a clock that moves a minute on at every reading
        WireReader reader = WireReader.of("-").withLiveClock(() -> WALL.plusSeconds(60L * reads.getAndIncrement()), Duration.ofMinutes(5));
        List<String> lines = new java.util.ArrayList<>();
        for (int i = 0; i < 1000; i++) lines.add(line("2026-12-02T12:00:00Z"));
        lines.add(line("2026-12-02T13:05:30Z")); // beyond 13:05, the first reading's limit: read again, the limit is later
        List<LineResult> r = new ArrayList<>();
        reader.readAll(new java.io.ByteArrayInputStream(String.join("\n", lines).getBytes(java.nio.charset.StandardCharsets.UTF_8)), r::add);
        assertThat(r).hasSize(1001).allMatch(x -> x instanceof LineResult.Event);
        assertThat(reads.get()).as("read every 64 lines and for the last one").isBetween(2, 1000 / 64 + 2);
        assertThat(reader.timeRefusals().get(TimeRefusal.AHEAD_OF_CLOCK)).isZero();
    }

    @Test
    void aRecordingWithAHeaderRefusesLinesOutsideItsPeriodWhateverTheWallClock() {
        WireReader reader = WireReader.of("night.jsonl");
        List<LineResult> r = read(reader,
                "{\"recording\":\"night\",\"from\":\"2027-03-14T00:00:00Z\",\"until\":\"2027-03-14T06:00:00Z\"}",
                line("2027-03-14T02:00:00Z"), line("2027-03-14T06:00:01Z"), line("2027-03-13T23:59:59Z"), line("2027-03-14T06:00:00Z"));
        assertThat(r.get(1)).isInstanceOf(LineResult.Event.class);
        assertThat(problem(r.get(2)).message()).contains("outside the recorded period of its header (2027-03-14T00:00:00Z to 2027-03-14T06:00:00Z, line 1)");
        assertThat(problem(r.get(3)).line()).isEqualTo(4);
        assertThat(r.get(4)).isInstanceOf(LineResult.Event.class);
        assertThat(reader.timeRefusals().get(TimeRefusal.OUTSIDE_RECORDING)).isEqualTo(2L);
    }

    @Test
    void aHeaderWhosePeriodStartsBefore1970IsRefusedAtItsField() {
        Problem p = problem(read(WireReader.of("old.jsonl"), "{\"recording\":\"old\",\"from\":\"1900-01-01T00:00:00Z\"}").get(0));
        assertThat(p.field()).isEqualTo("from");
        assertThat(p.message()).contains("before 1970");
    }

    @Test
    void whatTendJournaledItselfIsReadWithoutBounds() {
        assertThat(read(WireReader.trusted("journal"), line("2261-03-14T02:01:00Z")).get(0)).isInstanceOf(LineResult.Event.class);
    }

    @Test
    void aSignalOutsideTheDeclaredVocabularyIsRefusedWithASuggestion() {
        WireReader reader = WireReader.of("events.jsonl").withSignals(List.of(Id.of("heartbeat"), Id.of("storage-full")));
        String typo = "{\"at\":\"2026-03-14T02:00:00Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"hartbeat\",\"state\":\"silent\"}";
        List<LineResult> r = read(reader, typo, line("2026-03-14T02:00:00Z"));
        Problem p = problem(r.get(0));
        assertThat(p.toString()).startsWith("events.jsonl:1:");
        assertThat(p.field()).isEqualTo("signal");
        assertThat(p.message()).contains("'hartbeat' is not one of the signals tend.yaml declares (did you mean 'heartbeat'?)");
        assertThat(r.get(1)).isInstanceOf(LineResult.Event.class);
    }
}
