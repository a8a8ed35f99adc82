package dev.tend.runtime;

import java.util.Objects;

/**
 * Where an event was read in a partitioned stream: the record at {@code offset} of
 * {@code topic}'s partition {@code partition}. The driver stores the offset after it in the
 * transaction that journals the event (see {@link Orchestrator#submitEventAt}).
 */
public record StreamPosition(String topic, int partition, long offset) {
    public StreamPosition {
        Objects.requireNonNull(topic, "topic");
        if (topic.isBlank()) throw new IllegalArgumentException("topic must not be blank");
        if (partition < 0) throw new IllegalArgumentException("partition must be 0 or more, got " + partition);
        if (offset < 0) throw new IllegalArgumentException("offset must be 0 or more, got " + offset);
    }

    /** How a person reads it, e.g. {@code topic larkspur-health partition 2 offset 1187}. */
    public String describe() {
        return "topic " + topic + " partition " + partition + " offset " + offset;
    }
}
