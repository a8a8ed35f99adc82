package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

class FleetFileTest {
    /** The example of DESIGN.md section 3, as written there. */
    private static final String DESIGN_EXAMPLE = """
            fleet: larkspur
            clusters:
              - id: fares-3
                tags: { tier: critical, team: payments }
                replication: { factor: 3, min-healthy: 2 }   # copies of each piece of data, and how many must stay healthy
                quorum: true                                  # nodes form a majority-quorum ensemble
                nodes:
                  - { id: n1, zone: z-a }
                  - { id: n2, zone: z-b }
                  - { id: n3, zone: z-c }
            """;

    @Test
    void loadsTheExampleOfTheDesign() {
        Fleet fleet = FleetFile.parse("fleet.yaml", DESIGN_EXAMPLE);
        assertThat(fleet.name()).isEqualTo("larkspur");
        assertThat(fleet.size()).isEqualTo(1);
        ClusterSpec c = fleet.cluster(Id.of("fares-3")).orElseThrow();
        assertThat(c.tags()).isEqualTo(Map.of("tier", "critical", "team", "payments"));
        assertThat(c.replication()).isEqualTo(new Replication(3, 2));
        assertThat(c.quorum()).isTrue();
        assertThat(c.nodes()).extracting(n -> n.id().value()).containsExactly("n1", "n2", "n3");
        assertThat(c.node(Id.of("n2")).orElseThrow().zone()).isEqualTo("z-b");
        assertThat(fleet.zones()).containsExactly("z-a", "z-b", "z-c");
        assertThat(c.safeImpaired()).isEqualTo(1);
    }

    @Test
    void loadsTheSameFleetFromJson(@TempDir Path dir) throws Exception {
        Path file = Files.writeString(dir.resolve("fleet.json"), "{\"fleet\":\"larkspur\",\"clusters\":[{\"id\":\"fares-3\","
                + "\"tags\":{\"tier\":\"critical\",\"team\":\"payments\"},\"replication\":{\"factor\":3,\"min-healthy\":2},"
                + "\"quorum\":true,\"nodes\":[{\"id\":\"n1\",\"zone\":\"z-a\"},{\"id\":\"n2\",\"zone\":\"z-b\"},{\"id\":\"n3\",\"zone\":\"z-c\"}]}]}");
        Fleet fromJson = FleetFile.load(file);
        Fleet fromYaml = FleetFile.parse("fleet.yaml", DESIGN_EXAMPLE);
        assertThat(fromJson.clusters()).containsExactlyElementsOf(fromYaml.clusters());
    }

    @Test
    void reportsEveryMistakeInOneFileWithLineAndColumnInReadingOrder() {
        String text = """
                fleet: larkspur
                color: blue
                clusters:
                  - id: fares 3
                    replication: { factor: 3, min-healthy: 4 }
                    quorum: maybe
                    nodes:
                      - { id: n1, zone: z-a }
                      - { id: n1, zone: z b }
                  - id: dispatch-1
                    replication: { factor: three }
                    nodes: nope
                  - id: dispatch-1
                """;
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.parse("fleet.yaml", text));
        String notAnId = " is not an id: use letters, digits and . _ : - only, starting with a letter or digit";
        assertThat(e.problems()).extracting(Problem::toString).containsExactly(
                "fleet.yaml:2:1: unknown key 'color' in the fleet file; expected one of: clusters, fleet",
                "fleet.yaml:4:9: clusters[0].id: 'fares 3'" + notAnId,
                "fleet.yaml:5:44: clusters[0].replication.min-healthy (4) cannot exceed clusters[0].replication.factor (3):"
                        + " there are only 3 copies",
                "fleet.yaml:6:13: clusters[0].quorum: must be true or false, got 'maybe'",
                "fleet.yaml:9:9: clusters[0].nodes[1]: node n1 is listed twice; the first is clusters[0].nodes[0]",
                "fleet.yaml:9:25: clusters[0].nodes[1].zone: 'z b'" + notAnId,
                "fleet.yaml:11:18: clusters[1].replication needs 'min-healthy'",
                "fleet.yaml:11:28: clusters[1].replication.factor: must be a whole number, got 'three'",
                "fleet.yaml:12:12: clusters[1].nodes must be a list, got a value",
                "fleet.yaml:13:5: clusters[2]: cluster dispatch-1 is listed twice; the first is clusters[1]");
        assertThat(e.getMessage()).startsWith("fleet.yaml:2:1: unknown key 'color'").contains("\nfleet.yaml:13:5: ");
    }

    @Test
    void rejectsMinHealthyAboveTheFactor() {
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", """
                fleet: larkspur
                clusters:
                  - id: fares-3
                    replication: { factor: 3, min-healthy: 4 }
                """))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:4:44: clusters[0].replication.min-healthy (4) cannot exceed"
                        + " clusters[0].replication.factor (3): there are only 3 copies");
        assertThatThrownBy(() -> new Replication(3, 4))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("replication.min-healthy must be between 1 and the factor (3), got 4");
    }

    @Test
    void oldReplicationKeyIsRefusedNamingItsNewName() {
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", """
                fleet: larkspur
                clusters:
                  - id: fares-3
                    replication: { factor: 3, min-in-sync: 2 }
                """))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:4:31: 'min-in-sync' is now 'min-healthy'");
    }

    @Test
    void saysWhatIsMissingOrEmpty() {
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", ""))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:1:1: the fleet file needs 'fleet'\nfleet.yaml:1:1: the fleet file needs 'clusters'");
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", "fleet:\nclusters:\n"))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:1:7: fleet must be a value, got nothing\nfleet.yaml:2:10: clusters must be a list, got nothing");
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", "- fares-3\n"))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:1:1: a fleet file must be a mapping (key: value), got a list");
        assertThatThrownBy(() -> FleetFile.parse("fleet.yaml", "fleet: x\nclusters:\n  - tags: { tier: [a, b] }\n"))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("fleet.yaml:3:5: clusters[0] needs 'id'\nfleet.yaml:3:19: clusters[0].tags.tier must be a single value, got a list");
    }

    @Test
    void loadsAClusterWithoutNodesOrReplication() {
        Fleet fleet = FleetFile.parse("fleet.yaml", "fleet: larkspur\nclusters:\n  - id: dispatch-1\n");
        ClusterSpec c = fleet.cluster(Id.of("dispatch-1")).orElseThrow();
        assertThat(c.nodes()).isEmpty();
        assertThat(c.replication()).isNull();
        assertThat(c.quorum()).isFalse();
        assertThat(c.safeImpaired()).isEqualTo(Integer.MAX_VALUE);
    }

    @Test
    void aMisspelledKeyIsAnsweredWithTheNearestAllowedOne() {
        String text = """
                fleet: larkspur
                clustres:
                  - id: fares-3
                    nodes:
                      - { id: n1, zone: z-a }
                """;
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.parse("fleet.yaml", text));
        assertThat(e.problems()).extracting(Problem::toString).contains(
                "fleet.yaml:2:1: unknown key 'clustres' in the fleet file (did you mean 'clusters'?); expected one of: clusters, fleet");
    }
}
