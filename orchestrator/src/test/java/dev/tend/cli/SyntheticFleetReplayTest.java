package dev.tend.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The bundled policy on the synthetic fleet {@code tend record --synthesize} writes (2,000
 * clusters, almost seven times the demo fleet): its fleet brake is set in fractions of the
 * fleet, so the background noise of a large fleet does not hold the brake all day, and the
 * replay shows runs and what held them.
 */
class SyntheticFleetReplayTest {
    @TempDir
    Path dir;

    @Test
    void theBundledPolicyGivesAMeaningfulReplayOfALargeSyntheticFleet() throws Exception {
        Path recording = dir.resolve("day.jsonl");
        CliRun record = CliRun.of("record", "--synthesize", "--clusters", "2000", "--days", "1", "--seed", "1", "--out", recording.toString());
        assertThat(record.exit()).as(record.err()).isZero();

        CliRun replay = CliRun.of("replay", recording.toString(), "--playbooks", CliRun.root().resolve("playbooks/library").toString(),
                "--format", "json");

        assertThat(replay.exit()).as(replay.err()).isZero();
        JsonNode report = new ObjectMapper().readTree(replay.out());
        assertThat(report.get("replay").get("clusters").asInt()).isEqualTo(2000);
        assertThat(report.get("summary").get("runs_started").asInt()).as("runs on a day of a large fleet").isGreaterThan(20);
        Instant from = Instant.parse(report.get("recording").get("from").asText());
        Instant until = Instant.parse(report.get("recording").get("until").asText());
        Duration braked = Duration.ZERO;
        for (JsonNode b : report.get("brake_periods")) {
            Instant end = b.hasNonNull("released_at") ? Instant.parse(b.get("released_at").asText()) : until;
            braked = braked.plus(Duration.between(Instant.parse(b.get("engaged_at").asText()), end));
        }
        assertThat(braked).as("time under the fleet brake").isLessThan(Duration.between(from, until).dividedBy(4));
    }
}
