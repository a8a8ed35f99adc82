package dev.tend.replay;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.executor.SimulatedOutcome;
import dev.tend.playbooks.SimulatedAction;
import dev.tend.shared.Id;
import dev.tend.shared.time.Durations;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * How the fleet answers executor calls in a replay. A simulated action answers after its
 * duration with the outcome {@link SimulatedOutcome#of} gives for the seed and the call's
 * idempotency key (the function the live simulated executor uses, so the same key gives the
 * same answer in both), and on success names the signals it clears. An action that cannot
 * be simulated (command, http) is taken to succeed after {@link #UNSIMULATED_DURATION} and to
 * clear nothing; {@link #assumptions()} says so for each such action that was called.
 */
final class SimulatedFleet {
    static final Duration UNSIMULATED_DURATION = Duration.ofMinutes(1);

    private final long seed;
    private final Map<String, long[]> unsimulated = new TreeMap<>();

    SimulatedFleet(long seed) {
        this.seed = seed;
    }

    /** Schedules the answer to {@code call}, made at {@code now}, on {@code agenda}. */
    void answer(Effect.CallExecutor call, Instant now, Agenda agenda) {
        if (call.action() instanceof SimulatedAction a) {
            SimulatedOutcome o = SimulatedOutcome.of(seed, call.key(), a);
            List<Id> clears = o.success() ? a.clears() : List.of();
            Input.ExecutorResult result = new Input.ExecutorResult(call.runId(), call.stepId(), call.attempt(), o.success(),
                    o.success() ? "simulated success" : "simulated failure", clears, Map.of("simulated_ms", o.duration().toMillis()));
            agenda.answer(new Agenda.Answer(result, clears, call.target(), a.id().value()), now.plus(o.duration()));
            return;
        }
        unsimulated.computeIfAbsent(call.action().id() + " (" + call.action().kind() + ")", k -> new long[1])[0]++;
        Input.ExecutorResult result = new Input.ExecutorResult(call.runId(), call.stepId(), call.attempt(), true,
                "assumed success: a " + call.action().kind() + " action is not simulated in a replay", List.of(),
                Map.of("assumed", true));
        agenda.answer(new Agenda.Answer(result, List.of(), call.target(), call.action().id().value()), now.plus(UNSIMULATED_DURATION));
    }

    /** One sentence per action that could not be simulated, by action id. */
    List<String> assumptions() {
        List<String> out = new ArrayList<>();
        unsimulated.forEach((action, n) -> out.add("action " + action + " cannot be simulated: "
                + (n[0] == 1 ? "its one call was" : "each of its " + n[0] + " calls was") + " taken to succeed after " + Durations.format(UNSIMULATED_DURATION)
                + " and to clear nothing; give a simulated definition with --actions FILE to model it"));
        return out;
    }
}
