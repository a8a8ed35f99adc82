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

    /** A health transition or a topology event. */
    record Event(WireEvent event, long line) implements LineResult {
        public Event {
            Objects.requireNonNull(event, "event");
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
