package dev.tend.simulator.synth;

import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class SyntheticFleetFileTest {
    @Test
    void theFleetFileOf25000SyntheticClustersLoadsBackToTheSameFleet(@TempDir Path dir) throws Exception {
        // What `tend record --synthesize --clusters 25000` writes beside its recording.
        Fleet fleet = SyntheticFleet.of(25_000);
        Path file = Files.writeString(dir.resolve("fleet.yaml"), SyntheticFleet.yaml(fleet));
        assertThat(Files.size(file)).as("beyond the 3 MB a YAML reader takes by default").isGreaterThan(3L << 20);
        Fleet loaded = FleetFile.load(file);
        assertThat(loaded.name()).isEqualTo(fleet.name());
        assertThat(loaded.clusters()).containsExactlyElementsOf(fleet.clusters());
    }
}
