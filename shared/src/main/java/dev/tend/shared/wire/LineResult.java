package dev.tend.shared.wire;

import dev.tend.shared.Problem;
import dev.tend.shared.WireEvent;

import java.util.Objects;

/**
 * What one line of wire format v1 turned out to be. Every line read gives exactly one
 * result, so line numbers can be accounted for one by one.
 */
public sealed interface LineResult {
    /** The 1-based line number. */
    long line();

    /**
     * A health transition or a topology event.
     *
     * @param wire the event's line as {@link WireWriter#line(WireEvent)} writes it, or that
     *             line's {@link CompactLine} (as the journal keeps it), when the reader had it at
     *             hand (a line read by its fast path gives its compact line), else null; derived
     *             from {@code event}, so it takes no part in equality
     */
    record Event(WireEvent event, long line, String wire) implements LineResult {
        public Event {
            Objects.requireNonNull(event, "event");
        }

        public Event(WireEvent event, long line) {
            this(event, line, null);
        }

        /** The event's line as {@link WireWriter#line(WireEvent)} writes it: {@link #wire()} made whole, or written now. */
        public String wireLine() {
            return wire != null ? CompactLine.whole(wire, event.at(), event.cluster().value()) : WireWriter.line(event);
        }

        @Override
        public boolean equals(Object o) {
            return o instanceof Event e && line == e.line && event.equals(e.event);
        }

        @Override
        public int hashCode() {
            return 31 * event.hashCode() + Long.hashCode(line);
        }
    }

    /** The recording header, allowed once, before the first event. */
    record Header(RecordingHeader header, long line) implements LineResult {
        public Header {
            Objects.requireNonNull(header, "header");
        }
    }

    /** An empty or all-whitespace line; ignored. */
    record Blank(long line) implements LineResult {
    }

    /** A line that was rejected; {@code problem} says where and why. */
    record Bad(Problem problem) implements LineResult {
        public Bad {
            Objects.requireNonNull(problem, "problem");
        }

        @Override
        public long line() {
            return problem.line();
        }
    }
}
