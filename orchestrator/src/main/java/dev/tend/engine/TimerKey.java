package dev.tend.engine;

import java.util.Objects;
import java.util.Optional;

/**
 * What an engine timer is for. The engine arms and cancels timers by these values; the ports
 * ({@code Timers}, the journal's {@code TimerFired}, the replay's agenda) carry {@link #wire()},
 * and {@link #parse} is the one place a fired key is read back. The wire forms are journaled:
 * never change them.
 */
public sealed interface TimerKey {
    /** The key as armed, journaled and fired, e.g. {@code step:r000001:drain:1}. */
    String wire();

    /** A held candidate's hold comes due ({@code recheck:CANDIDATE}); the candidate key as {@code Candidate.Key#toString}. */
    record Recheck(String candidate) implements TimerKey {
        public String wire() { return "recheck:" + candidate; }
    }

    /** The brake's page has gathered long enough ({@code brake:page}). */
    record BrakePage() implements TimerKey {
        public String wire() { return "brake:page"; }
    }

    /** The fleet stayed below the brake's release threshold long enough ({@code brake:settle}). */
    record BrakeSettle() implements TimerKey {
        public String wire() { return "brake:settle"; }
    }

    /** A pending approval lapses ({@code approval:RUN}). */
    record ApprovalExpiry(String run) implements TimerKey {
        public String wire() { return "approval:" + run; }
    }

    /** A pending approval is about to lapse: page once more ({@code approval-reminder:RUN}). */
    record ApprovalReminder(String run) implements TimerKey {
        public String wire() { return "approval-reminder:" + run; }
    }

    /** An attempt of an action step timed out ({@code step:RUN:STEP:ATTEMPT}). */
    record StepTimeout(String run, String step, int attempt) implements TimerKey {
        public String wire() { return "step:" + run + ":" + step + ":" + attempt; }
    }

    /** A wait-healthy step waited its {@code within} ({@code wait:RUN:STEP}). */
    record WaitTimeout(String run, String step) implements TimerKey {
        public String wire() { return "wait:" + run + ":" + step; }
    }

    /** The key {@code wire} stands for; empty for a key this version never arms. */
    static Optional<TimerKey> parse(String wire) {
        Objects.requireNonNull(wire, "wire");
        int colon = wire.indexOf(':');
        if (colon < 0) return Optional.empty();
        String rest = wire.substring(colon + 1);
        switch (wire.substring(0, colon)) {
            case "recheck":
                return Optional.of(new Recheck(rest));
            case "brake":
                if (rest.equals("page")) return Optional.of(new BrakePage());
                if (rest.equals("settle")) return Optional.of(new BrakeSettle());
                return Optional.empty();
            case "approval":
                return Optional.of(new ApprovalExpiry(rest));
            case "approval-reminder":
                return Optional.of(new ApprovalReminder(rest));
            case "step": {
                String[] p = rest.split(":", -1);
                if (p.length != 3) return Optional.empty();
                try {
                    return Optional.of(new StepTimeout(p[0], p[1], Integer.parseInt(p[2])));
                } catch (NumberFormatException notAnAttempt) {
                    return Optional.empty();
                }
            }
            case "wait": {
                String[] p = rest.split(":", -1);
                return p.length == 2 ? Optional.of(new WaitTimeout(p[0], p[1])) : Optional.empty();
            }
            default:
                return Optional.empty();
        }
    }
}
