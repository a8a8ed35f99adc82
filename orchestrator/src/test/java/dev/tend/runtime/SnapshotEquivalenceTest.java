package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EngineState;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.RateLimit;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.SnapshotRow;
import org.junit.jupiter.api.AfterAll;
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
    /** What the sequences of all seeds, and of the seeds with the tight policy, made the engines do. */
    private static final Coverage ALL = new Coverage();
    private static final Coverage TIGHT = new Coverage();

    /**
     * The sequences went through the state a snapshot must carry: run gates that stood runs
     * down, rolling budgets that held candidates, the brake's gathered page with pages folded
     * into it, flapping pages, approval pages and their reminders, exclusions.
     */
    @AfterAll
    static void theSequencesWentThroughGatesBudgetsAndPages() {
        assertThat(ALL.counts).containsKeys("run-standing-down", "page:flapping", "page:approval-requested",
                "page:approval-lapsing", "page:playbook", "exclusion-added", "reason:masked", "reason:excluded");
        assertThat(TIGHT.counts).containsKeys("reason:rate-limit", "page:brake", "page-folded", "brake-engaged:automatic");
    }

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6})
    void snapshotPlusTailGivesTheSameEffectsAndStateAsTheFullSequence(long seed) {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));
        EventTimeMode mode = seed % 2 == 0 ? EventTimeMode.eventsOnly() : EventTimeMode.following(Duration.ofMinutes(2));
        // Odd seeds run a tight policy: a fleet-wide budget of 4 starts in any hour and a brake
        // that engages at 6 unhealthy clusters, so rolling budgets hold candidates and the
        // brake's gathered page goes out.
        boolean tight = seed % 2 == 1;
        TendConfig c = set.config();
        TendConfig config = tight ? new TendConfig(c.defaults(), c.brake(), c.freezes(), new RateLimit(4, Duration.ofHours(1)),
                c.maxSkew(), c.signals(), c.source(), c.contentHash(), c.paging()) : c;
        BrakeThresholds brake = tight ? new BrakeThresholds(6, null, 3, null, true, "oncall", Duration.ofMinutes(5))
                : BrakeThresholds.from(c.brake());
        EngineSetup setup = new EngineSetup(set, config, fleet, brake, mode);
        String fingerprint = SnapshotCodec.fingerprint(setup);
        Engine full = new Engine(setup);
        Engine restored = null;
        Coverage seen = new Coverage();
        RandomInputs inputs = new RandomInputs(seed, fleet, 40, Instant.parse("2027-03-14T01:00:00Z"));
        for (int i = 1; i <= STEPS; i++) {
            RandomInputs.Step step = inputs.next();
            List<Effect> expected = RandomInputs.handle(full, step);
            if (restored != null) {
                List<Effect> actual = RandomInputs.handle(restored, step);
                assertThat(actual).as("effects of input %d (%s), seed %d", i, step.input(), seed).isEqualTo(expected);
            }
            inputs.observe(expected);
            seen.count(expected);
            if (i % SNAPSHOT_EVERY == 0) {
                if (restored != null) {
                    assertThat(json(restored.state())).as("state after input %d, seed %d", i, seed).isEqualTo(json(full.state()));
                }
                EngineState state = full.state();
                java.util.Map<String, Long> sources = java.util.Map.of("ingest:" + seed, (long) i);
                SnapshotRow row = SnapshotCodec.encode(i, step.now(), fingerprint, state, sources);
                // the format tend wrote before (format 1) must still give the same state: the odd points restore from it
                SnapshotRow older = FormatOneSnapshot.of(i, step.now(), fingerprint, state, sources);
                SnapshotCodec.Decoded decoded = SnapshotCodec.decode(row);
                SnapshotCodec.Decoded decodedOlder = SnapshotCodec.decode(older);
                assertThat(decoded.sources()).containsEntry("ingest:" + seed, (long) i);
                assertThat(decodedOlder.sources()).isEqualTo(decoded.sources());
                assertThat(json(decoded.state())).as("the stored form gives back the state").isEqualTo(json(state));
                assertThat(json(decodedOlder.state())).as("format 1 gives back the state").isEqualTo(json(state));
                restored = Engine.restore(setup, (i / SNAPSHOT_EVERY) % 2 == 0 ? decoded.state() : decodedOlder.state());
            }
        }
        assertThat(full.inputsHandled()).isEqualTo(STEPS);
        assertThat(full.runs()).as("the sequence started runs").isNotEmpty();
        System.out.println("seed " + seed + ": " + seen);
        (tight ? TIGHT : ALL).counts.putAll(seen.counts);
        if (tight) ALL.counts.putAll(seen.counts);
    }

    /** What the sequence made the engine do, so that the test shows it went through gates, budgets and pages. */
    private static final class Coverage {
        final java.util.TreeMap<String, Integer> counts = new java.util.TreeMap<>();

        void count(List<Effect> effects) {
            for (Effect e : effects) {
                if (e instanceof Effect.Ledger l) {
                    add(l.type().wire());
                    if (l.type() == dev.tend.engine.LedgerKind.BRAKE_ENGAGED) add("brake-engaged:" + l.fields().get("by"));
                    Object reasons = l.fields().get("reasons");
                    if (reasons instanceof java.util.Collection<?> c) for (Object r : c) add("reason:" + r);
                } else if (e instanceof Effect.Notify n) add("page:" + n.kind());
            }
        }

        void add(String k) {
            counts.merge(k, 1, Integer::sum);
        }

        @Override
        public String toString() {
            return counts.toString();
        }
    }

    private static String json(EngineState s) {
        return SnapshotCodec.json(s);
    }
}
