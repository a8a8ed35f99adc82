package dev.tend.replay;

import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.simulator.Recording;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.ReplayReport;
import dev.tend.simulator.report.RunEntry;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The bundled demo recordings, replayed through the bundled library with the default seed, do what their headers say. */
class DemoRecordingsTest {
    private static final Path ROOT = ReplayFiles.root();

    private static ReplayReport replay(String name) {
        Recording rec = Recording.open(ROOT.resolve("simulator/recordings/" + name + ".jsonl"));
        assertThat(rec.headerFleet()).as("the header's relative fleet path resolves").isPresent();
        return Replayer.of(PlaybookLoader.load(ROOT.resolve("playbooks/library")),
                FleetFile.load(ROOT.resolve("playbooks/library/fleet.yaml")), 1).replay(rec);
    }

    @Test
    void everyDemoRecordingHasAHeaderWithItsNameTheFleetAPeriodAndADescription() {
        for (String name : List.of("quiet-night", "zone-outage", "owner-filled-disks", "flapping-signal")) {
            Recording rec = Recording.open(ROOT.resolve("simulator/recordings/" + name + ".jsonl"));
            assertThat(rec.header()).as(name).hasValueSatisfying(h -> {
                assertThat(h.name()).isEqualTo(name);
                assertThat(h.fleet()).isEqualTo("../../playbooks/library/fleet.yaml");
                assertThat(h.from()).isNotNull();
                assertThat(h.until()).isAfter(h.from());
                assertThat(h.description()).isNotBlank().doesNotContain("\n");
            });
            assertThat(rec.read((e, line) -> { }).isClean()).as(name).isTrue();
        }
    }

    @Test
    void onTheQuietNightBothSilentNodesAreReplacedAndTheirLaterSilenceIsHidden() {
        ReplayReport r = replay("quiet-night");
        assertThat(r.runs()).extracting(RunEntry::target).containsExactly("tickets-12/n2", "telemetry-7/n3");
        assertThat(r.runs()).allSatisfy(run -> assertThat(run.outcome()).isEqualTo("succeeded"));
        assertThat(r.summary().runsSucceeded()).isEqualTo(2);
        assertThat(r.summary().hiddenEvents()).isPositive();
        assertThat(r.summary().brakeEngaged()).isFalse();
    }

    @Test
    void theZoneOutageEngagesTheBrakeWhichPagesOnceAndStartsNoRun() {
        ReplayReport r = replay("zone-outage");
        assertThat(r.summary().brakeEngaged()).isTrue();
        assertThat(r.brakePeriods()).singleElement().satisfies(b -> {
            assertThat(b.engagedBy()).isEqualTo("automatic");
            assertThat(b.releasedAt()).as("released once the zone was back and the fleet settled").isNotNull();
        });
        assertThat(r.notifications()).singleElement().satisfies(n -> assertThat(n.message()).startsWith("fleet brake engaged"));
        assertThat(r.runs()).isEmpty();
        assertThat(r.decisions()).anySatisfy(d -> assertThat(d.reasons()).contains(ReasonCode.FLEET_BRAKE));
        assertThat(r.decisions()).noneSatisfy(d -> assertThat(d.verdict()).isEqualTo(Verdict.START));
    }

    @Test
    void theOwnerFilledDisksAreMaskedAndNoRunStarts() {
        ReplayReport r = replay("owner-filled-disks");
        assertThat(r.runs()).isEmpty();
        List<DecisionEntry> onDisks = r.decisions().stream()
                .filter(d -> List.of("tickets-12/n3", "tickets-13/n2", "tickets-14/n1").contains(d.target())).toList();
        assertThat(onDisks).isNotEmpty().allSatisfy(d -> {
            assertThat(d.verdict()).isEqualTo(Verdict.DENY);
            assertThat(d.reasons()).contains(ReasonCode.MASKED);
        });
        assertThat(onDisks).extracting(d -> d.playbook().value()).contains("restart-stopped-process", "move-leadership-off-lagging-node");
    }

    @Test
    void theFlappingHeartbeatStartsNoRunAndPagesOnce() {
        ReplayReport r = replay("flapping-signal");
        assertThat(r.runs()).isEmpty();
        assertThat(r.decisions()).filteredOn(d -> d.target().equals("dispatch-21/n3"))
                .anySatisfy(d -> assertThat(d.reasons()).contains(ReasonCode.FLAPPING))
                .allSatisfy(d -> assertThat(d.verdict()).isEqualTo(Verdict.HOLD));
        assertThat(r.notifications()).singleElement().satisfies(n -> assertThat(n.message()).contains("dispatch-21/n3/heartbeat is flapping"));
    }
}
