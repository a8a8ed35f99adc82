package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.Input;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.wire.WireWriter;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * What {@code tend ingest}'s reader hands the driver ({@link NumberedInputs}): the transition as
 * read, its wire line, its signal numbered once, and an engine that decides on these exactly as
 * on the inputs made without numbers.
 */
class NumberedInputsTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");

    @Test
    void aSignalReadTwiceIsNumberedOnceWithTheSameIdsAndItsWireLine() {
        NumberedInputs inputs = new NumberedInputs();
        HealthTransition first = HealthTransition.of(Instant.parse("2027-03-14T02:17:00Z"), "fares-3", "n2", "heartbeat", SignalState.SILENT);
        HealthTransition again = HealthTransition.of(Instant.parse("2027-03-14T02:18:00.5Z"), "fares-3", "n2", "heartbeat", SignalState.CLEAR);
        HealthTransition other = HealthTransition.of(Instant.parse("2027-03-14T02:18:01Z"), "fares-3", null, "heartbeat", SignalState.BREACH);
        Input.Transition a = (Input.Transition) inputs.of(first);
        Input.Transition b = (Input.Transition) inputs.of(again);
        Input.Transition c = (Input.Transition) inputs.of(other);
        assertThat(a.transition()).isEqualTo(first);
        assertThat(b.transition()).isEqualTo(again);
        assertThat(a.wire()).isEqualTo(WireWriter.line(first));
        assertThat(b.wire()).isEqualTo(WireWriter.line(again));
        assertThat(b.numbered()).isSameAs(a.numbered());
        assertThat(c.numbered().number()).isNotEqualTo(a.numbered().number());
        assertThat(b.transition().cluster()).isSameAs(a.transition().cluster());
        assertThat(c.transition().signal()).isSameAs(a.transition().signal());
    }

    @Test
    void linesReadWithItsCanonicalIdsGiveTheInputsOfLinesReadWithout() {
        String lines = String.join("\n",
                "{\"at\":\"2027-03-14T02:17:00Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"signal\":\"heartbeat\",\"state\":\"silent\"}",
                "{\"state\":\"clear\",\"signal\":\"heartbeat\",\"node\":\"n2\",\"cluster\":\"fares-3\",\"at\":\"2027-03-14T02:18:00Z\"}",
                "{\"at\":\"2027-03-14T02:18:01Z\",\"cluster\":\"fares-3\",\"node\":\"n2\",\"topology\":\"left\"}", "");
        NumberedInputs canonical = new NumberedInputs();
        NumberedInputs looked = new NumberedInputs();
        List<Input> a = new java.util.ArrayList<>();
        List<Input> b = new java.util.ArrayList<>();
        canonical.canonicalIds(dev.tend.shared.wire.WireReader.of("e.jsonl")).readAll(new java.io.ByteArrayInputStream(lines.getBytes(java.nio.charset.StandardCharsets.UTF_8)),
                r -> { if (r instanceof dev.tend.shared.wire.LineResult.Event e) a.add(canonical.ofCanonical(e)); });
        dev.tend.shared.wire.WireReader.of("e.jsonl").readAll(new java.io.ByteArrayInputStream(lines.getBytes(java.nio.charset.StandardCharsets.UTF_8)),
                r -> { if (r instanceof dev.tend.shared.wire.LineResult.Event e) b.add(looked.of(e)); });
        assertThat(a).hasSize(3);
        for (int i = 0; i < 2; i++) {
            Input.Transition x = (Input.Transition) a.get(i);
            Input.Transition y = (Input.Transition) b.get(i);
            assertThat(x.transition()).isEqualTo(y.transition());
            assertThat(x.wire()).isEqualTo(y.wire());
            assertThat(x.numbered().key()).isEqualTo(y.numbered().key());
        }
        assertThat(((Input.Topology) a.get(2)).event()).isEqualTo(((Input.Topology) b.get(2)).event());
        // the fast path's line and the general way's share the instances
        Input.Transition first = (Input.Transition) a.get(0);
        Input.Transition second = (Input.Transition) a.get(1);
        assertThat(second.transition().cluster()).isSameAs(first.transition().cluster());
        assertThat(second.numbered()).isSameAs(first.numbered());
        assertThat(((Input.Topology) a.get(2)).event().node()).isSameAs(first.transition().node());
    }

    @Test
    void anEngineFedNumberedInputsDecidesAsOneFedThemUnnumbered() {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));
        for (long seed = 1; seed <= 4; seed++) {
            EventTimeMode mode = EventTimeMode.eventsOnly();
            EngineSetup setup = new EngineSetup(set, set.config(), fleet, dev.tend.engine.BrakeThresholds.from(set.config().brake()), mode);
            Engine plain = new Engine(setup);
            Engine numbered = new Engine(setup);
            NumberedInputs reader = new NumberedInputs();
            RandomInputs inputs = new RandomInputs(seed, fleet, 40, Instant.parse("2027-03-14T01:00:00Z"));
            int transitions = 0;
            for (int i = 1; i <= 1_000; i++) {
                RandomInputs.Step step = inputs.next();
                List<Effect> expected = RandomInputs.handle(plain, step);
                Input in = step.input() instanceof Input.Transition t ? reader.of(t.transition())
                        : step.input() instanceof Input.Topology o ? reader.of(o.event()) : step.input();
                if (in instanceof Input.Transition) transitions++;
                assertThat(numbered.handle(in, step.now())).as("effects of input %d (%s), seed %d", i, step.input(), seed)
                        .isEqualTo(expected);
                inputs.observe(expected);
            }
            assertThat(transitions).isGreaterThan(300);
            assertThat(numbered.state()).isEqualTo(plain.state());
        }
    }
}
