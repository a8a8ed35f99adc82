package dev.tend.simulator;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.wire.ReadSummary;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class RecordingTest {
    @TempDir
    Path dir;

    private static final String FLEET = """
            fleet: larkspur
            clusters:
              - id: fares-3
                nodes: [{ id: n1, zone: z-a }, { id: n2, zone: z-b }, { id: n3, zone: z-c }]
            """;

    @Test
    void readsTheHeaderThenEveryEventInFileOrderEvenWhenOutOfTimeOrder() throws Exception {
        Path file = write("""
                {"recording":"night","fleet":"fleet.yaml","from":"2027-03-14T02:00:00Z","until":"2027-03-14T04:00:00Z","description":"one line"}
                {"at":"2027-03-14T02:05:00Z","cluster":"fares-3","node":"n2","signal":"heartbeat","state":"silent"}
                {"at":"2027-03-14T02:01:00Z","cluster":"fares-3","node":"n1","signal":"cpu-high","state":"breach"}
                """);
        Recording r = Recording.open(file);
        assertThat(r.name()).isEqualTo("night");
        assertThat(r.header()).hasValueSatisfying(h -> assertThat(h.description()).isEqualTo("one line"));
        List<WireEvent> events = new ArrayList<>();
        ReadSummary s = r.read((e, line) -> events.add(e));
        assertThat(s.events()).isEqualTo(2);
        assertThat(events).extracting(e -> ((HealthTransition) e).signal().value()).containsExactly("heartbeat", "cpu-high");
    }

    @Test
    void badLinesAreReportedLocatedAndSkipped() throws Exception {
        Path file = write("""
                {"at":"2027-03-14T02:05:00Z","cluster":"fares-3","node":"n2","signal":"heartbeat","state":"silent"}
                {"at":"2027-03-14 02:06","cluster":"fares-3","signal":"heartbeat","state":"silent"}
                not json at all
                {"at":"2027-03-14T02:07:00Z","cluster":"fares-3","node":"n2","signal":"heartbeat","state":"clear"}
                """);
        List<WireEvent> events = new ArrayList<>();
        List<Problem> problems = new ArrayList<>();
        ReadSummary s = Recording.open(file).read(new Recording.Sink() {
            @Override
            public void event(WireEvent event, long line) {
                events.add(event);
            }

            @Override
            public void problem(Problem problem) {
                problems.add(problem);
            }
        });
        assertThat(events).hasSize(2);
        assertThat(s.bad()).isEqualTo(2);
        assertThat(problems).extracting(Problem::line).containsExactly(2, 3);
        assertThat(problems.get(0).toString()).startsWith(file + ":2:").contains("field 'at'");
        assertThat(problems.get(1).field()).isEmpty();
    }

    @Test
    void aRecordingWithoutHeaderIsNamedByItsFile() throws Exception {
        Path file = write("{\"at\":\"2027-03-14T02:05:00Z\",\"cluster\":\"fares-3\",\"signal\":\"key-revoked\",\"state\":\"breach\"}\n");
        Recording r = Recording.open(file);
        assertThat(r.header()).isEmpty();
        assertThat(r.name()).isEqualTo("rec.jsonl");
        assertThat(r.headerFleet()).isEmpty();
    }

    @Test
    void theHeadersFleetPathIsResolvedRelativeToTheRecording() throws Exception {
        Files.createDirectories(dir.resolve("fleets"));
        Files.writeString(dir.resolve("fleets/larkspur.yaml"), FLEET);
        Files.createDirectories(dir.resolve("recordings"));
        Path file = dir.resolve("recordings/rec.jsonl");
        Files.writeString(file, "{\"recording\":\"r\",\"fleet\":\"../fleets/larkspur.yaml\"}\n");
        Fleet fleet = Recording.open(file).headerFleet().orElseThrow();
        assertThat(fleet.cluster(dev.tend.shared.Id.of("fares-3"))).isPresent();
    }

    @Test
    void anInlineFleetInTheHeaderIsRead() throws Exception {
        Path file = write("{\"recording\":\"r\",\"fleet\":{\"fleet\":\"inline\",\"clusters\":[{\"id\":\"dispatch-1\",\"nodes\":[{\"id\":\"n1\",\"zone\":\"z-a\"}]}]}}\n");
        Fleet fleet = Recording.open(file).headerFleet().orElseThrow();
        assertThat(fleet.name()).isEqualTo("inline");
        assertThat(fleet.size()).isEqualTo(1);
    }

    @Test
    void aMissingFleetFileNamedByTheHeaderIsAnInputErrorSayingWhatToPass() throws Exception {
        Path file = write("{\"recording\":\"r\",\"fleet\":\"nowhere.yaml\"}\n");
        assertThatThrownBy(() -> Recording.open(file).headerFleet())
                .isInstanceOf(InvalidInputException.class)
                .hasMessageContaining("names the fleet file 'nowhere.yaml'")
                .hasMessageContaining("pass --fleet FILE");
    }

    @Test
    void aMissingRecordingIsAnInputError() {
        assertThatThrownBy(() -> Recording.open(dir.resolve("gone.jsonl")))
                .isInstanceOf(InvalidInputException.class)
                .hasMessageContaining("gone.jsonl: no such recording");
    }

    private Path write(String text) throws Exception {
        Path file = dir.resolve("rec.jsonl");
        Files.writeString(file, text);
        return file;
    }
}
