package dev.tend.simulator.synth;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.WireEvent;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.fleet.NodeSpec;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.simulator.Recording;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class SynthesizerTest {
    @TempDir
    Path dir;

    @Test
    void theSameSeedWritesTheSameBytesAndAnotherSeedOthers() throws Exception {
        Synthesizer.write(Synthesizer.Options.of(40, 1, 5), dir.resolve("a.jsonl"));
        Synthesizer.write(Synthesizer.Options.of(40, 1, 5), dir.resolve("b.jsonl"));
        Synthesizer.write(Synthesizer.Options.of(40, 1, 6), dir.resolve("c.jsonl"));
        assertThat(Files.readString(dir.resolve("a.jsonl")).replace("\"fleet\":\"a.fleet.yaml\"", ""))
                .isEqualTo(Files.readString(dir.resolve("b.jsonl")).replace("\"fleet\":\"b.fleet.yaml\"", ""));
        assertThat(Files.readString(dir.resolve("a.fleet.yaml"))).isEqualTo(Files.readString(dir.resolve("b.fleet.yaml")));
        assertThat(Files.readString(dir.resolve("a.jsonl"))).isNotEqualTo(Files.readString(dir.resolve("c.jsonl")));
    }

    @Test
    void writesAValidRecordingWhoseHeaderNamesTheFleetWrittenBesideIt() throws Exception {
        Synthesizer.Result r = Synthesizer.write(Synthesizer.Options.of(60, 2, 1), dir.resolve("week.jsonl"));
        assertThat(r.fleet()).isEqualTo(dir.resolve("week.fleet.yaml"));
        Recording rec = Recording.open(r.recording());
        assertThat(rec.header().orElseThrow().fleet()).isEqualTo("week.fleet.yaml");
        assertThat(rec.header().orElseThrow().from()).isEqualTo(Synthesizer.DEFAULT_START);
        assertThat(rec.header().orElseThrow().until()).isEqualTo(Synthesizer.DEFAULT_START.plusSeconds(2 * 86_400));
        Fleet fleet = rec.headerFleet().orElseThrow();
        assertThat(fleet.size()).isEqualTo(60);
        assertThat(fleet.zones()).containsExactly("z-a", "z-b", "z-c");
        ReadSummary s = rec.read((e, line) -> { });
        assertThat(s.isClean()).isTrue();
        assertThat(s.events()).isEqualTo(r.events());
    }

    @Test
    void aboutSeventyEventsPerClusterPerDaySoTwoThousandClustersMakeAMillionAWeek() {
        // the full size is measured by the benchmark; here a smaller fleet, the same rate
        Synthesizer.Options o = Synthesizer.Options.of(200, 2, 1);
        EventBuffer events = Synthesizer.generate(o, SyntheticFleet.of(200));
        double perClusterDay = events.size / 400.0;
        assertThat(perClusterDay).isBetween(65.0, 78.0);
    }

    @Test
    void showsTheBackgroundTheDesignAsksFor() throws Exception {
        Synthesizer.Result r = Synthesizer.write(Synthesizer.Options.of(100, 4, 3), dir.resolve("s.jsonl"));
        Recording rec = Recording.open(r.recording());
        Fleet fleet = rec.headerFleet().orElseThrow();
        Map<String, String> zoneOf = new HashMap<>();
        for (ClusterSpec c : fleet.clusters()) for (NodeSpec n : c.nodes()) zoneOf.put(c.id() + "/" + n.id(), n.zone());
        List<HealthTransition> events = new ArrayList<>();
        rec.read((WireEvent e, long line) -> {
            if (e instanceof HealthTransition t) events.add(t);
        });
        // the zone outage: every node of z-b goes silent within a few minutes, and no node of another zone
        Map<String, Instant> firstSilent = new HashMap<>();
        for (HealthTransition t : events) {
            if (t.signal().value().equals("heartbeat") && t.state() == SignalState.SILENT) firstSilent.putIfAbsent(t.cluster() + "/" + t.node(), t.at());
        }
        Set<String> zb = new HashSet<>();
        zoneOf.forEach((node, zone) -> { if (zone.equals("z-b")) zb.add(node); });
        assertThat(firstSilent.keySet()).containsAll(zb);
        long underReplicated = events.stream().filter(t -> t.node() == null && t.signal().value().equals("under-replicated")
                && t.state() == SignalState.BREACH).count();
        assertThat(underReplicated).isEqualTo(100);
        // owner-caused full disks followed by process-down on the same node
        List<HealthTransition> full = events.stream().filter(t -> t.signal().value().equals("storage-full") && t.state() == SignalState.BREACH).toList();
        assertThat(full).isNotEmpty();
        HealthTransition disk = full.get(0);
        assertThat(events).anySatisfy(t -> {
            assertThat(t.cluster()).isEqualTo(disk.cluster());
            assertThat(t.node()).isEqualTo(disk.node());
            assertThat(t.signal().value()).isEqualTo("process-down");
            assertThat(t.at()).isAfter(disk.at());
        });
        // a few events arrive late: the file is in arrival order, not event-time order
        long outOfOrder = 0;
        for (int i = 1; i < events.size(); i++) if (events.get(i).at().isBefore(events.get(i - 1).at())) outOfOrder++;
        assertThat(outOfOrder).isPositive();
    }

    @Test
    void theFleetFileLoadsAndEveryClusterBearsOneNodeInThreeImpaired() throws Exception {
        Fleet fleet = SyntheticFleet.of(120);
        Path file = dir.resolve("f.yaml");
        Files.writeString(file, SyntheticFleet.yaml(fleet));
        Fleet loaded = FleetFile.load(file);
        assertThat(loaded.size()).isEqualTo(120);
        for (ClusterSpec c : loaded.clusters()) {
            assertThat(c.safeImpaired()).as(c.id().value()).isGreaterThanOrEqualTo((int) Math.floor(c.size() * 0.34));
            assertThat(c.tags()).containsKeys("tier", "team", "kind");
        }
        assertThat(loaded.clusters()).extracting(c -> c.id().value()).contains("fares-1", "dispatch-1", "tickets-1", "telemetry-1",
                "schedules-1", "coord-1");
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "0|7|clusters must be between 1 and 100000, got 0",
            "100001|7|clusters must be between 1 and 100000, got 100001",
            "10|0|days must be between 1 and 366, got 0",
            "10|367|days must be between 1 and 366, got 367"})
    void rejectsSizesOutsideItsLimits(int clusters, int days, String message) {
        assertThatThrownBy(() -> Synthesizer.Options.of(clusters, days, 1)).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }

    @Test
    void rejectsAStartThatIsNotAWholeSecond() {
        assertThatThrownBy(() -> new Synthesizer.Options(1, 1, 1, Instant.parse("2027-03-01T00:00:00.5Z")))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("start must be a whole second, got 2027-03-01T00:00:00.500Z");
    }

    @Test
    void theFleetFileIsNamedAfterTheRecording() {
        assertThat(Synthesizer.fleetPathFor(Path.of("out/week.jsonl"))).isEqualTo(Path.of("out/week.fleet.yaml"));
        assertThat(Synthesizer.fleetPathFor(Path.of("week"))).isEqualTo(Path.of("week.fleet.yaml"));
    }
}
