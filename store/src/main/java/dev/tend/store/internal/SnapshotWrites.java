package dev.tend.store.internal;

import dev.tend.store.SnapshotRow;
import org.jdbi.v3.core.Handle;

/** Writes a snapshot row in a write transaction and keeps only the newest ones. */
final class SnapshotWrites {
    private SnapshotWrites() {
    }

    /** Puts {@code snap} (replacing one with its seq) and deletes all but the newest {@code keep}. */
    static void put(Handle handle, SnapshotRow snap, int keep) {
        handle.createUpdate("DELETE FROM snapshots WHERE seq = :seq").bind("seq", snap.seq()).execute();
        handle.createUpdate("INSERT INTO snapshots (seq, taken_ns, format, setup, body) VALUES (:seq, :taken, :format, :setup, :body)")
                .bind("seq", snap.seq())
                .bind("taken", Times.toNanos(snap.takenAt(), "SnapshotRow.takenAt"))
                .bind("format", snap.format())
                .bind("setup", snap.setup())
                .bind("body", snap.body())
                .execute();
        handle.createUpdate("DELETE FROM snapshots WHERE seq NOT IN (SELECT seq FROM snapshots ORDER BY seq DESC LIMIT :keep)")
                .bind("keep", keep)
                .execute();
    }
}
