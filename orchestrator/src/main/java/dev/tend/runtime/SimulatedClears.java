package dev.tend.runtime;

import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.shared.Id;

import java.util.List;

/**
 * The simulated fleet reports the signals an action cleared, as a health pipeline would: one
 * clear transition per signal at the engine's event time, queued right behind the result in
 * the same batch. On the driver thread, the only one that reads the engine.
 */
final class SimulatedClears {
    private SimulatedClears() {
    }

    /** Adds to {@code batch} the clears of {@code r} (none when its run is gone), decided on {@code engine}. */
    static void queueBehind(Engine engine, Input.ExecutorResult r, List<Input> batch) {
        engine.run(r.runId()).ifPresent(run -> {
            for (Id s : r.clears()) batch.add(Input.Transition.simulatedClear(engine.eventTime(), run.target(), s));
        });
    }
}
