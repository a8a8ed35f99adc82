package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * A snapshot of the engine as kept in the store: its state after the input at journal
 * {@code seq}. The store keeps the bytes and does not read them.
 *
 * @param seq     the journal seq of the last input the state includes (at least 1)
 * @param takenAt when it was taken (processing time)
 * @param format  the version of the body's layout, from 1
 * @param setup   a fingerprint of the policy and fleet the engine ran with
 * @param body    the state, in the writer's encoding
 */
public record SnapshotRow(long seq, Instant takenAt, int format, String setup, byte[] body) {
    public SnapshotRow {
        if (seq < 1) throw new IllegalArgumentException("SnapshotRow.seq must be at least 1, got " + seq);
        Objects.requireNonNull(takenAt, "SnapshotRow.takenAt must not be null");
        if (format < 1) throw new IllegalArgumentException("SnapshotRow.format must be at least 1, got " + format);
        Objects.requireNonNull(setup, "SnapshotRow.setup must not be null");
        Objects.requireNonNull(body, "SnapshotRow.body must not be null");
    }
}
