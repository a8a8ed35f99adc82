package dev.tend.runtime;

import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.shared.TendException;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;

import java.util.HashMap;
import java.util.Map;
import java.util.Optional;

/**
 * An engine built from a store's newest snapshot and the journal after it, kept current by
 * reading what was journaled since ({@link #catchUp}): how a start rebuilds the engine, and
 * how a standby keeps a warm one to take over with. Journaled inputs are fed to the engine
 * with their effects discarded (they are in the store already). One thread at a time.
 */
public final class JournalTail {
    private final Store store;
    private Engine engine;
    private long seq;
    private long snapshotSeq;
    private long replayed;
    private final Map<String, Long> sources = new HashMap<>();

    private JournalTail(Store store) {
        this.store = store;
    }

    /**
     * The engine of the newest snapshot, when it was taken under this setup (or the
     * journal's start was archived, so only it can cover that start), else a new engine
     * that will read the whole journal. Throws {@link TendException} for a snapshot of a
     * newer format, or a journal whose start was archived with no snapshot to cover it.
     */
    public static JournalTail open(Store store, EngineSetup setup, String fingerprint) {
        return open(store, setup, () -> fingerprint);
    }

    /**
     * As {@link #open(Store, EngineSetup, String)}, with the setup's fingerprint asked for only
     * when there is a snapshot to compare it with: it hashes the whole fleet, which took about
     * 75 ms of a start on a fleet of 2,000 clusters that a new store does not need (DEVELOPERS.md, "Ingest").
     */
    public static JournalTail open(Store store, EngineSetup setup, java.util.function.Supplier<String> fingerprint) {
        JournalTail t = new JournalTail(store);
        long first = store.read(StoreReader::firstInputSeq);
        Optional<SnapshotRow> snapshot = store.read(StoreReader::latestSnapshot);
        boolean wholeJournal = first <= 1;
        t.engine = new Engine(setup);
        if (snapshot.isPresent()) {
            SnapshotRow row = snapshot.get();
            SnapshotCodec.Decoded d = SnapshotCodec.decode(row);
            if (!wholeJournal || row.setup().equals(fingerprint.get())) {
                t.engine = Engine.restore(setup, d.state());
                t.sources.putAll(d.sources());
                t.seq = row.seq();
                t.snapshotSeq = row.seq();
            }
        }
        if (!wholeJournal && t.seq + 1 < first) {
            throw new TendException("the journal of " + store.location() + " starts at input " + first + " (older inputs were "
                    + "archived) but no snapshot covers the inputs before it" + (t.seq > 0 ? " (the newest ends at " + t.seq + ")" : "")
                    + "; restore the archived inputs or a store backup");
        }
        return t;
    }

    /** Reads the inputs journaled after the last one read into the engine; returns how many. */
    public long catchUp() {
        long[] n = {0};
        long from = seq;
        store.read(r -> {
            r.forEachInput(from, row -> {
                seq = row.seq();
                if (row.kind().equals(SourceProgress.KIND)) {
                    SourceProgress p = SourceProgress.decode(row);
                    sources.put(p.source(), p.events());
                    return;
                }
                engine.handle(InputCodec.decode(row), row.now());
                n[0]++;
            });
            return null;
        });
        replayed += n[0];
        return n[0];
    }

    public Engine engine() {
        return engine;
    }

    /** The journal seq of the last row read (or of the snapshot started from). */
    public long seq() {
        return seq;
    }

    /** The seq of the snapshot started from; 0 when the whole journal was read. */
    public long snapshotSeq() {
        return snapshotSeq;
    }

    /** Journaled inputs fed to the engine so far (after the snapshot). */
    public long replayed() {
        return replayed;
    }

    /** Events done of each input file, by its identity (see {@link SourceProgress}). */
    public Map<String, Long> sources() {
        return Map.copyOf(sources);
    }
}
