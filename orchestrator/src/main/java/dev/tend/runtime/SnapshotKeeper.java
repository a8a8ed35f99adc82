package dev.tend.runtime;

import dev.tend.engine.Engine;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EngineState;
import dev.tend.store.SnapshotRow;
import dev.tend.store.Store;
import dev.tend.store.StoreReader;

import java.time.Instant;
import java.util.HashMap;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.Executor;

/**
 * Where the {@link Orchestrator}'s engine starts from and what it leaves for the next start:
 * the newest snapshot and the journal after it (or a warm tail a standby kept), and the
 * snapshots written while it runs.
 */
final class SnapshotKeeper {
    /** Snapshots kept in the store: the newest, and one before it. */
    private static final int KEPT = 2;

    private final Store store;
    private final EngineSetup setup;
    private volatile String fingerprint;
    /** Runs each encoding on a daemon thread of its own (one every few thousand inputs at most). */
    private static final Executor ENCODER = task -> {
        Thread t = new Thread(task, "tend-snapshot");
        t.setDaemon(true);
        t.start();
    };

    /** The snapshot being encoded, not stored yet; null when none. */
    private CompletableFuture<SnapshotRow> encoding;
    /** A warm engine to start from at the next {@link #tail}, or null. */
    private JournalTail warm;
    /** How far each input file was journaled, as the last {@link #tail} found it. */
    private final Map<String, Long> progressFound = new HashMap<>();

    SnapshotKeeper(Store store, EngineSetup setup) {
        this.store = store;
        this.setup = setup;
    }

    /** Starts the next {@link #tail} from {@code tail}, kept warm on this store and setup. */
    void adopt(JournalTail tail) {
        this.warm = Objects.requireNonNull(tail, "tail");
    }

    /** The tail to build the engine from: the warm one adopted, else one opened on the store's newest snapshot. */
    JournalTail tail() {
        JournalTail tail = warm != null ? warm : JournalTail.open(store, setup, this::fingerprint);
        warm = null;
        return tail;
    }

    /** Records how far each input file was journaled, as {@code tail} (caught up) found it. */
    void caughtUp(JournalTail tail) {
        progressFound.clear();
        progressFound.putAll(tail.sources());
    }

    /** How many events of the input file {@code source} the journal held when the engine was built (0 for a new one). */
    long progressOf(String source) {
        return progressFound.getOrDefault(source, 0L);
    }

    /**
     * Takes {@code engine}'s state, with the progress of the inputs read from files (the
     * current {@code source}, if not null, at {@code sourceDone} events), as the snapshot after
     * the newest journal row, and has it encoded on a thread of its own (on a fleet of 2,000
     * clusters the encoding costs as much as deciding thousands of inputs); {@link #collect}
     * stores it once encoded. A snapshot still being encoded is stored first. False when the
     * journal is empty.
     */
    boolean write(Engine engine, String source, long sourceDone, Instant at) {
        collect(true);
        long seq = store.read(StoreReader::lastInputSeq);
        if (seq == 0) return false;
        return write(engine.state(), seq, source, sourceDone, at); // plain values, nothing shared with the engine
    }

    /**
     * As {@link #write(Engine, String, long, Instant)}, with the state taken earlier: the
     * engine's {@code state} after the journal's rows up to {@code seq} (committed).
     */
    boolean write(EngineState state, long seq, String source, long sourceDone, Instant at) {
        collect(true);
        if (seq == 0) return false;
        Map<String, Long> sources = new TreeMap<>(progressFound);
        if (source != null) sources.put(source, sourceDone);
        // the setup's fingerprint too is made on the encoder's thread, the first time
        encoding = CompletableFuture.supplyAsync(() -> SnapshotCodec.encode(seq, at, fingerprint(), state, sources), ENCODER);
        return true;
    }

    /**
     * Stores the snapshot being encoded once it is ready ({@code wait}: waits for it), in a
     * transaction of its own on the calling thread, the driver's. Throws what the encoding threw.
     */
    void collect(boolean wait) {
        CompletableFuture<SnapshotRow> e = encoding;
        if (e == null || (!wait && !e.isDone())) return;
        encoding = null;
        SnapshotRow row = dev.tend.shared.Futures.joined(e);
        store.useTransaction(tx -> tx.putSnapshot(row, KEPT));
    }

    /** The setup's fingerprint, made when first needed (on the driver's or the encoder's thread; made twice at worst, alike). */
    private String fingerprint() {
        String f = fingerprint;
        if (f == null) fingerprint = f = SnapshotCodec.fingerprint(setup);
        return f;
    }
}
