package dev.tend.shared.fleet;

import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/**
 * Fleet files far beyond SnakeYAML's default 3 MB input limit. This class runs in its own
 * surefire execution with a 160 MB heap (see shared/pom.xml): the 100,000-node files are
 * 6 to 9 MB of text, and a parse tree of the whole document would not fit beside the fleet.
 */
class LargeFleetFileTest {
    private static final int CLUSTERS = 25_000;
    private static final int NODES_PER_CLUSTER = 4;
    private static final String[] ZONES = {"z-a", "z-b", "z-c"};

    @TempDir
    Path dir;

    @Test
    void aYamlFleetOf100000NodesLoads() throws IOException {
        Path file = dir.resolve("fleet.yaml");
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            w.write("fleet: larkspur\nclusters:\n");
            for (int c = 0; c < CLUSTERS; c++) {
                w.write("  - id: fares-" + c + "\n    tags: { tier: standard, team: fares }\n"
                        + "    replication: { factor: 3, min-healthy: 2 }\n    nodes:\n");
                for (int n = 0; n < NODES_PER_CLUSTER; n++) {
                    w.write("      - { id: n" + n + ", zone: " + ZONES[(c + n) % 3] + " }\n");
                }
            }
        }
        assertThat(Files.size(file)).isGreaterThan(3L << 20);
        assertLoadsWhole(FleetFile.load(file));
    }

    @Test
    void aJsonFleetOf100000NodesLoads() throws IOException {
        Path file = dir.resolve("fleet.json");
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            w.write("{\"fleet\": \"larkspur\", \"clusters\": [\n");
            for (int c = 0; c < CLUSTERS; c++) {
                w.write((c == 0 ? "" : ",\n") + "{\"id\": \"fares-" + c + "\", \"tags\": {\"tier\": \"standard\", \"team\": \"fares\"}, "
                        + "\"replication\": {\"factor\": 3, \"min-healthy\": 2}, \"nodes\": [");
                for (int n = 0; n < NODES_PER_CLUSTER; n++) {
                    w.write((n == 0 ? "" : ", ") + "{\"id\": \"n" + n + "\", \"zone\": \"" + ZONES[(c + n) % 3] + "\"}");
                }
                w.write("]}");
            }
            w.write("\n]}\n");
        }
        assertThat(Files.size(file)).isGreaterThan(3L << 20);
        assertLoadsWhole(FleetFile.load(file));
    }

    @Test
    void aMistakeDeepInALargeJsonFleetIsReportedWithItsLineAndTheGoodClustersAroundItAreRead() throws IOException {
        Path file = dir.resolve("fleet.json");
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            w.write("{\"fleet\": \"larkspur\", \"clusters\": [\n");
            for (int c = 0; c < 5_000; c++) {
                String zone = c == 4_321 ? "z b" : "z-a";
                w.write((c == 0 ? "" : ",\n") + "{\"id\": \"fares-" + c + "\", \"nodes\": [{\"id\": \"n1\", \"zone\": \"" + zone + "\"}]}");
            }
            w.write("\n]}\n");
        }
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(e.problems()).hasSize(1);
        Problem p = e.problems().get(0);
        assertThat(p.line()).isEqualTo(4_323); // cluster c is on line c + 2 (the first line opens the list)
        assertThat(p.column()).isEqualTo(53); // where the zone's value starts
        assertThat(p.message()).startsWith("clusters[4321].nodes[0].zone: 'z b' is not an id");
    }

    private static void assertLoadsWhole(Fleet fleet) {
        assertThat(fleet.size()).isEqualTo(CLUSTERS);
        long nodes = fleet.clusters().stream().mapToLong(c -> c.nodes().size()).sum();
        assertThat(nodes).isEqualTo(100_000);
        ClusterSpec last = fleet.cluster(Id.of("fares-" + (CLUSTERS - 1))).orElseThrow();
        assertThat(last.replication()).isEqualTo(new Replication(3, 2));
        assertThat(last.node(Id.of("n3")).orElseThrow().zone()).isEqualTo(ZONES[(CLUSTERS - 1 + 3) % 3]);
        assertThat(fleet.zones()).containsExactlyInAnyOrder(ZONES);
    }
}
