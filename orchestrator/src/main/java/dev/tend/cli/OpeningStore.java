package dev.tend.cli;

import dev.tend.shared.Futures;
import dev.tend.store.Store;

import java.util.concurrent.CompletableFuture;
import java.util.function.Supplier;

/**
 * A store being opened on a thread of its own while the command does its other preparing
 * (reading the playbooks and the fleet): opening a new SQLite file runs every migration, and
 * both took about a third of a second at the start of {@code tend ingest} (DEVELOPERS.md,
 * "Ingest"). {@link #get()} gives the store or throws what opening it threw; when the command
 * fails before it asks, {@link #discard()} waits for the opening and closes what it opened, so
 * that no connection or file handle outlives the command.
 */
final class OpeningStore {
    private final CompletableFuture<Store> opening;

    private OpeningStore(Supplier<Store> open) {
        opening = Futures.onThread("tend-store-open", open);
    }

    /** Starts opening the store {@code open} gives. */
    static OpeningStore start(Supplier<Store> open) {
        return new OpeningStore(open);
    }

    /** The opened store; what the opening threw, unwrapped, when it failed. */
    Store get() {
        return Futures.joined(opening);
    }

    /** The command ends without the store: waits for the opening and closes the store if it opened. */
    void discard() {
        try {
            opening.join().close();
        } catch (RuntimeException e) {
            // the command already fails for another reason, which it reports
        }
    }
}
