package dev.tend.executor;

import dev.tend.engine.Effect;

import java.util.Map;

/**
 * The values an action's templates may use. Every value is built from ids that matched the
 * id pattern ({@code key} joins three of them with slashes), so no hostile text reaches a
 * program or a URL.
 */
final class Placeholders {
    private Placeholders() {
    }

    static Map<String, String> of(Effect.CallExecutor call) {
        return Map.of(
                "cluster", call.target().cluster().value(),
                "node", call.target().node() == null ? "" : call.target().node().value(),
                "run", call.runId(),
                "key", call.key(),
                "step", call.stepId(),
                "attempt", Integer.toString(call.attempt()));
    }
}
