package dev.tend.playbooks.lint;

import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.Scope;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.util.Map;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

class BundledLibraryTest {
    static final Path LIBRARY = Path.of("library");
    static final Set<String> ALL_EXECUTORS = Set.of("command", "http", "simulated");

    @Test
    void libraryIsCleanAgainstItsFleet() {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));

        assertThat(Lint.check(set, fleet, ALL_EXECUTORS)).isEmpty();
        assertThat(Lint.check(set, null, ALL_EXECUTORS)).isEmpty();
    }

    @Test
    void libraryHoldsTheFourExamplePlaybooksInFileNameOrder() {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);

        assertThat(set.playbooks()).extracting(p -> p.id().value()).containsExactly(
                "move-leadership-off-lagging-node", "replace-silent-node", "restart-stopped-process", "rotate-expiring-certificate");
        Playbook replace = set.playbook(Id.of("replace-silent-node")).orElseThrow();
        assertThat(replace.trigger().signal()).isEqualTo(Id.of("heartbeat"));
        assertThat(replace.trigger().state()).isEqualTo(SignalState.SILENT);
        assertThat(replace.trigger().scope()).isEqualTo(Scope.NODE);
        assertThat(replace.approval().isRequiredFor(Map.of("tier", "critical"))).isTrue();
        assertThat(replace.approval().isRequiredFor(Map.of("tier", "standard"))).isFalse();
        Playbook rotate = set.playbook(Id.of("rotate-expiring-certificate")).orElseThrow();
        assertThat(rotate.trigger().scope()).isEqualTo(Scope.CLUSTER);
        assertThat(rotate.window()).isNotNull();
        for (Playbook p : set.playbooks()) {
            assertThat(p.onFailure()).as(p.id() + " on-failure").isNotEmpty();
            assertThat(p.steps()).as(p.id() + " steps").anyMatch(s -> s.kind().equals("wait-healthy"));
            assertThat(p.steps()).filteredOn(s -> s instanceof ActionStep)
                    .allMatch(s -> ((ActionStep) s).timeout() != null);
        }
        assertThat(set.actions().byId().values()).allMatch(a -> a.kind().equals("simulated"));
    }

    @Test
    void demoFleetHasThreeHundredClustersInThreeZones() {
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));

        assertThat(fleet.size()).isEqualTo(300);
        assertThat(fleet.zones()).containsExactly("z-a", "z-b", "z-c");
        assertThat(fleet.clusters()).extracting(ClusterSpec::size).allMatch(n -> n >= 3 && n <= 6);
        assertThat(fleet.clusters()).filteredOn(ClusterSpec::quorum).isNotEmpty();
        assertThat(fleet.clusters()).filteredOn(c -> c.replication() != null && c.replication().factor() == 5).isNotEmpty();
        assertThat(fleet.clusters()).filteredOn(c -> c.replication() != null && c.replication().minHealthy() == 1).isNotEmpty();
    }
}
