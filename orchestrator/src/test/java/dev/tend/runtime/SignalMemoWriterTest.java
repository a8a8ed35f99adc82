package dev.tend.runtime;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.module.SimpleModule;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.fleet.HealthMemo;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The hand-written signal writer gives the snapshot exactly the JSON the record mapping gave it. */
class SignalMemoWriterTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");

    private final ObjectMapper byRecords = SnapshotCodec.recordMapper(SnapshotCodec.textModule());
    private final ObjectMapper byWriter = SnapshotCodec.recordMapper(SnapshotCodec.textModule())
            .registerModule(new SimpleModule("signals").addSerializer(HealthMemo.Signal.class, new SignalMemoWriter()));

    @Test
    void writesEverySignalShapeAsTheRecordMappingDoes() throws Exception {
        Instant t = Instant.parse("2027-03-14T02:17:00Z");
        List<HealthMemo.Signal> signals = List.of(
                new HealthMemo.Signal(new SignalKey(Id.of("fares-3"), Id.of("n1"), Id.of("heartbeat")), SignalState.SILENT,
                        t, t.plusMillis(500), List.of(t.minusSeconds(90), t.plusNanos(1_500), t.plusNanos(7))),
                new HealthMemo.Signal(new SignalKey(Id.of("dispatch-1"), null, Id.of("replica-lag")), SignalState.CLEAR,
                        t.minusSeconds(3600), t, List.of()),
                new HealthMemo.Signal(new SignalKey(Id.of("dispatch-1"), Id.of("n2"), Id.of("cert-expiry")), SignalState.BREACH,
                        t, null, List.of(t)));
        for (HealthMemo.Signal s : signals) {
            assertThat(byWriter.writeValueAsString(s)).isEqualTo(byRecords.writeValueAsString(s));
        }
        HealthMemo memo = new HealthMemo(signals, List.of(), List.of(), 2, 9);
        assertThat(byWriter.writeValueAsString(memo)).isEqualTo(byRecords.writeValueAsString(memo));
    }

    @Test
    void aWholeEngineStateIsWrittenAsTheRecordMappingWritesIt() throws Exception {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        Engine engine = new Engine(setup);
        RandomInputs inputs = new RandomInputs(7, fleet, 40, Instant.parse("2027-03-14T01:00:00Z"));
        for (int i = 0; i < 400; i++) {
            RandomInputs.Step step = inputs.next();
            inputs.observe(RandomInputs.handle(engine, step));
        }
        var state = engine.state();
        assertThat(state.health().signals()).as("the sequence left signals in the view").hasSizeGreaterThan(20);
        assertThat(state.health().signals()).as("some with recent changes")
                .anySatisfy(s -> assertThat(s.changes()).isNotEmpty());
        assertThat(SnapshotCodec.json(state)).isEqualTo(byRecords.writeValueAsString(state));
    }
}
