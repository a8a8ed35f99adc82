package dev.tend.runtime;

import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.InputRow;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A store starts from its snapshot, in this tend's format or in format 1 (what tend wrote
 * before), at the state a replay of its whole journal builds, and decides the inputs after it
 * as that replay does. Real SQLite stores.
 */
class SnapshotFormatTest {
    private static final Path LIBRARY = dev.tend.testing.RepositoryRoot.path().resolve("playbooks/library");
    private static final int JOURNALED = 600;
    private static final int SNAPSHOT_AT = 400;
    private static final int AFTER = 200;

    @TempDir
    Path dir;

    @Test
    void aStoreStartsFromASnapshotOfThisFormatAsFromItsWholeJournal() {
        startsAsTheWholeJournal(false);
    }

    @Test
    void aStoreStartsFromAFormatOneSnapshotAsFromItsWholeJournal() {
        startsAsTheWholeJournal(true);
    }

    /** {@code state}'s JSON with the health view's signals in the order of their keys. */
    private static com.fasterxml.jackson.databind.JsonNode withSignalsSorted(dev.tend.engine.EngineState state) {
        try {
            com.fasterxml.jackson.databind.ObjectMapper m = new com.fasterxml.jackson.databind.ObjectMapper();
            com.fasterxml.jackson.databind.JsonNode root = m.readTree(SnapshotCodec.json(state));
            com.fasterxml.jackson.databind.node.ArrayNode signals = (com.fasterxml.jackson.databind.node.ArrayNode) root.path("health").path("signals");
            List<com.fasterxml.jackson.databind.JsonNode> all = new ArrayList<>();
            signals.forEach(all::add);
            all.sort(java.util.Comparator.comparing(n -> n.path("key").toString()));
            signals.removeAll();
            signals.addAll(all);
            return root;
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    private void startsAsTheWholeJournal(boolean formatOne) {
        PlaybookSet set = PlaybookLoader.load(LIBRARY);
        Fleet fleet = FleetFile.load(LIBRARY.resolve("fleet.yaml"));
        EngineSetup setup = new EngineSetup(set, set.config(), fleet, BrakeThresholds.from(set.config().brake()),
                EventTimeMode.eventsOnly());
        String fingerprint = SnapshotCodec.fingerprint(setup);
        Engine live = new Engine(setup);
        RandomInputs inputs = new RandomInputs(11, fleet, 40, Instant.parse("2027-03-14T01:00:00Z"));
        try (Store store = Store.openSqlite(dir.resolve("tend.db"))) {
            List<InputRow> rows = new ArrayList<>();
            for (int i = 1; i <= JOURNALED; i++) {
                RandomInputs.Step step = inputs.next();
                inputs.observe(RandomInputs.handle(live, step));
                rows.add(InputCodec.encode(step.input(), step.now()));
                if (i == SNAPSHOT_AT) {
                    List<InputRow> before = List.copyOf(rows);
                    store.useTransaction(tx -> tx.appendInputs(before));
                    rows.clear();
                    Map<String, Long> sources = Map.of("ingest:larkspur", 390L);
                    SnapshotRow row = formatOne
                            ? FormatOneSnapshot.of(i, step.now(), fingerprint, live.state(), sources)
                            : SnapshotCodec.encode(i, step.now(), fingerprint, live.state(), sources);
                    assertThat(row.format()).isEqualTo(formatOne ? 1 : SnapshotCodec.FORMAT);
                    store.useTransaction(tx -> tx.putSnapshot(row, 2));
                }
            }
            store.useTransaction(tx -> tx.appendInputs(rows));

            JournalTail fromSnapshot = JournalTail.open(store, setup, fingerprint);
            fromSnapshot.catchUp();
            JournalTail whole = JournalTail.open(store, setup, "not this setup: the whole journal");
            whole.catchUp();
            assertThat(fromSnapshot.snapshotSeq()).as("started from the snapshot").isEqualTo(SNAPSHOT_AT);
            assertThat(fromSnapshot.replayed()).as("replayed only the journal after it").isEqualTo(JOURNALED - SNAPSHOT_AT);
            assertThat(fromSnapshot.sources()).containsEntry("ingest:larkspur", 390L);
            assertThat(whole.snapshotSeq()).isZero();
            assertThat(whole.replayed()).isEqualTo(JOURNALED);
            assertThat(SnapshotCodec.json(fromSnapshot.engine().state())).as("the state of the engine that journaled it all")
                    .isEqualTo(SnapshotCodec.json(live.state()));
            // a replay that took no snapshot lists the health view's signals in its map's order: the same signals
            assertThat(withSignalsSorted(fromSnapshot.engine().state())).as("the state of a replay of the whole journal")
                    .isEqualTo(withSignalsSorted(whole.engine().state()));

            // and the next inputs are decided alike
            for (int i = 0; i < AFTER; i++) {
                RandomInputs.Step step = inputs.next();
                List<Effect> expected = RandomInputs.handle(whole.engine(), step);
                assertThat(RandomInputs.handle(fromSnapshot.engine(), step)).as("effects of input %d", JOURNALED + i + 1)
                        .isEqualTo(expected);
                inputs.observe(expected);
            }
        }
    }
}
