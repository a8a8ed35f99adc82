package dev.tend.engine;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.SignalState;
import dev.tend.shared.Target;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.SignalNumbering;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * Everything the engine reacts to. Each input is journaled before the engine sees it, so
 * replaying the journal rebuilds the engine's state exactly. The processing time of an
 * input is passed beside it to {@link Engine#handle}, never read from a clock inside.
 */
public sealed interface Input {
    /** The journal kind, e.g. {@code transition}. */
    String kind();

    /** The cluster the input concerns, or null. */
    default Id cluster() {
        return null;
    }

    /**
     * A health transition. {@code wire} is its wire format v1 line, or that line's compact form
     * as the journal keeps it ({@link dev.tend.shared.wire.CompactLine}), when the reader already
     * has it (so the journal need not write it again on the engine's thread), else null.
     * {@code numbered} is its signal's key numbered by the reader ({@link SignalNumbering}), so
     * that the engine's health view finds the signal without a map lookup, else null.
     */
    record Transition(HealthTransition transition, String wire, SignalNumbering.Numbered numbered) implements Input {
        public Transition {
            Objects.requireNonNull(transition, "transition");
            if (numbered != null) {
                SignalKey k = numbered.key();
                if (!k.cluster().equals(transition.cluster()) || !Objects.equals(k.node(), transition.node())
                        || !k.signal().equals(transition.signal())) {
                    throw new IllegalArgumentException("the numbered key " + k + " is not the transition's " + transition.key());
                }
            }
        }

        public Transition(HealthTransition transition) {
            this(transition, null, null);
        }

        public Transition(HealthTransition transition, String wire) {
            this(transition, wire, null);
        }

        /** The transition's signal key: the numbered key's instance when there is one. */
        public SignalKey key() {
            return numbered != null ? numbered.key() : transition.key();
        }

        /** The transition with its wire line computed now, on the calling thread. */
        public static Transition withWire(HealthTransition t) {
            return new Transition(t, dev.tend.shared.wire.WireWriter.line(t));
        }

        /**
         * What the simulated fleet reports after a simulated action cleared {@code signal} on
         * {@code target}, as a health pipeline would: a clear at {@code at}, marked
         * {@code origin: simulated}. The one place it is built, for the live driver and replay.
         */
        public static Transition simulatedClear(Instant at, Target target, Id signal) {
            return new Transition(new HealthTransition(at, target.cluster(), target.node(), signal, SignalState.CLEAR,
                    Map.of(), Map.of("origin", "simulated")));
        }

        public String kind() { return "transition"; }
        public Id cluster() { return transition.cluster(); }
    }

    record Topology(TopologyEvent event) implements Input {
        public String kind() { return "topology"; }
        public Id cluster() { return event.cluster(); }
    }

    /** A timer armed by the engine came due. */
    record TimerFired(String key) implements Input {
        public TimerFired { Objects.requireNonNull(key, "key"); }
        public String kind() { return "timer"; }
    }

    /**
     * An executor answered a call.
     *
     * @param success  the action did what it should
     * @param clears   signals the action reports as cleared on the target (simulated actions)
     * @param detail   exit code, output excerpt, HTTP status and the like
     */
    record ExecutorResult(String runId, String stepId, int attempt, boolean success, String message,
                          List<Id> clears, Map<String, Object> detail) implements Input {
        public ExecutorResult {
            clears = clears == null ? List.of() : List.copyOf(clears);
            detail = detail == null ? Map.of() : Map.copyOf(detail);
        }
        public String kind() { return "executor-result"; }
    }

    /** After a restart: a call was in flight, its action cannot be asked again by key. */
    record OutcomeUnknown(String runId, String stepId, int attempt) implements Input {
        public String kind() { return "outcome-unknown"; }
    }

    /** Operator commands, each carrying who gave it and from where. */
    sealed interface Command extends Input {
        String by();
        String from();
    }

    record Approve(String runId, String by, String from) implements Command {
        public String kind() { return "approve"; }
    }

    record Reject(String runId, String reason, String by, String from) implements Command {
        public String kind() { return "reject"; }
    }

    record AbortRun(String runId, String reason, String by, String from) implements Command {
        public String kind() { return "abort"; }
    }

    /** Adds an exclusion; {@code until} null means until removed. */
    record Exclude(Target target, String reason, String owner, Instant until, String by, String from) implements Command {
        public String kind() { return "exclude-add"; }
        public Id cluster() { return target.cluster(); }
    }

    record Unexclude(Target target, String by, String from) implements Command {
        public String kind() { return "exclude-remove"; }
        public Id cluster() { return target.cluster(); }
    }

    record EngageBrake(String reason, String by, String from) implements Command {
        public String kind() { return "brake-engage"; }
    }

    record ReleaseBrake(String reason, String by, String from) implements Command {
        public String kind() { return "brake-release"; }
    }

    /** Lets automation act on a target again after the loop guard stopped it. */
    record ClearLoop(Id playbook, Target target, String by, String from) implements Command {
        public String kind() { return "loop-clear"; }
        public Id cluster() { return target.cluster(); }
    }

    /** Processing time moved on with no other input (serve mode): lets event time follow. */
    record Tick() implements Input {
        public String kind() { return "tick"; }
    }
}
