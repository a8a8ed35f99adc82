package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EngineState;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.SnapshotRow;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A snapshot plus the inputs after it is the engine of a full replay: on random input
 * sequences, an engine restored from a snapshot (written to the stored format and read
 * back) and the engine that handled every input give the same effects for every next
 * input, and reach the same state.
 */
class SnapshotEquivalenceTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");
    private static final int STEPS = 1_000;
    private static final int SNAPSHOT_EVERY = 100;

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6})
    void snapshotPlusTailGivesTheSameEffectsAndStateAsTheFullSequence(long seed) {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));
        EventTimeMode mode = seed % 2 == 0 ? EventTimeMode.eventsOnly() : EventTimeMode.following(Duration.ofMinutes(2));
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()), mode);
        String fingerprint = SnapshotCodec.fingerprint(setup);
        Engine full = new Engine(setup);
        Engine restored = null;
        RandomInputs inputs = new RandomInputs(seed, fleet, 40, Instant.parse("2027-03-14T01:00:00Z"));
        for (int i = 1; i <= STEPS; i++) {
            RandomInputs.Step step = inputs.next();
            List<Effect> expected = RandomInputs.handle(full, step);
            if (restored != null) {
                List<Effect> actual = RandomInputs.handle(restored, step);
                assertThat(actual).as("effects of input %d (%s), seed %d", i, step.input(), seed).isEqualTo(expected);
            }
            inputs.observe(expected);
            if (i % SNAPSHOT_EVERY == 0) {
                if (restored != null) {
                    assertThat(json(restored.state())).as("state after input %d, seed %d", i, seed).isEqualTo(json(full.state()));
                }
                SnapshotRow row = SnapshotCodec.encode(i, step.now(), fingerprint, full.state(), java.util.Map.of("ingest:" + seed, (long) i));
                SnapshotCodec.Decoded decoded = SnapshotCodec.decode(row);
                assertThat(decoded.sources()).containsEntry("ingest:" + seed, (long) i);
                EngineState back = decoded.state();
                assertThat(json(back)).as("the stored form gives back the state").isEqualTo(json(full.state()));
                restored = Engine.restore(setup, back);
            }
        }
        assertThat(full.inputsHandled()).isEqualTo(STEPS);
        assertThat(full.runs()).as("the sequence started runs").isNotEmpty();
    }

    private static String json(EngineState s) {
        return SnapshotCodec.json(s);
    }
}
