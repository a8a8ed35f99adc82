package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One input the engine took, as kept in the input journal: replaying the journal in
 * {@code seq} order rebuilds the engine's state.
 *
 * @param seq     position in the journal, from 1; 0 on a row not yet appended (the store
 *                assigns it)
 * @param kind    what sort of input, e.g. {@value #TRANSITION}, {@value #TOPOLOGY}, a timer
 *                firing, an executor result or an operator command
 * @param now     the engine clock's time when the input was taken
 * @param eventAt event time of a transition or topology event; null for inputs that have
 *                none
 * @param cluster the cluster the input is about; null when it is about none (or many)
 * @param payload the input itself as JSON text; the store keeps it byte for byte and does
 *                not parse it. A transition's or topology event's wire line may be given in its
 *                {@link dev.tend.shared.wire.CompactLine} form (without the {@code at} and
 *                {@code cluster} that {@code eventAt} and {@code cluster} hold): it is kept so,
 *                and read back whole
 */
public record InputRow(long seq, String kind, Instant now, Instant eventAt, String cluster, String payload) {
    /** Kind of a health transition input. */
    public static final String TRANSITION = "transition";
    /** Kind of a topology event input. */
    public static final String TOPOLOGY = "topology";

    public InputRow {
        if (seq < 0) throw new IllegalArgumentException("InputRow.seq must be 0 (not yet appended) or positive, got " + seq);
        Objects.requireNonNull(kind, "InputRow.kind must not be null");
        if (kind.isBlank()) throw new IllegalArgumentException("InputRow.kind must not be blank");
        Objects.requireNonNull(now, "InputRow.now must not be null");
        Objects.requireNonNull(payload, "InputRow.payload must not be null");
    }

    /** A row to append: seq 0, the store assigns it. */
    public static InputRow of(String kind, Instant now, Instant eventAt, String cluster, String payload) {
        return new InputRow(0, kind, now, eventAt, cluster, payload);
    }

    public InputRow withSeq(long newSeq) {
        return new InputRow(newSeq, kind, now, eventAt, cluster, payload);
    }
}
