package dev.tend.page;

import java.util.List;
import java.util.Objects;

/**
 * A receiver's answer to one delivery attempt.
 *
 * @param outcome what the outbox does next
 * @param text    the receiver's answer as a person reads it ("HTTP 503: busy", "250 OK", "exit 0"); never a secret
 * @param tries   for channels that try more than once within an attempt, each try's answer in order; else empty
 */
public record Answer(Outcome outcome, String text, List<String> tries) {
    /** Accepted: delivered. Retry: not delivered, try again later. Refused: the receiver said no for good. */
    public enum Outcome { ACCEPTED, RETRY, REFUSED }

    public Answer {
        Objects.requireNonNull(outcome, "outcome");
        Objects.requireNonNull(text, "text");
        tries = List.copyOf(tries);
    }

    public static Answer accepted(String text) {
        return new Answer(Outcome.ACCEPTED, text, List.of());
    }

    public static Answer retry(String text) {
        return new Answer(Outcome.RETRY, text, List.of());
    }

    public static Answer refused(String text) {
        return new Answer(Outcome.REFUSED, text, List.of());
    }

    public Answer withTries(List<String> t) {
        return new Answer(outcome, text, t);
    }
}
