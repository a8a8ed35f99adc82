package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.EngineState;
import dev.tend.engine.Input;
import dev.tend.store.InputRow;

import java.time.Instant;
import java.util.BitSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A batch the driver decided and has not yet acted on: its inputs (with the clears the
 * simulated fleet reported queued behind their results), which of them came from the events
 * queue, the input file's progress row (null: none), when and with what effects each input
 * was decided, what their effects write that could be made ahead ({@link Projections.Prepared}),
 * how many events of the input file are done once it is committed, and the stream positions
 * it reaches, the timer operations of its effects that later ones replace ({@link TimerOps}),
 * neither written nor performed; the engine's state after it when it is to be the next snapshot (null: it is not),
 * and the seq of its last journal row, set by its commit. Written by {@link CommitWriter#batch};
 * its effects are performed only after that.
 */
record DecidedBatch(List<Input> inputs, BitSet queued, InputRow progress, List<Instant> times,
                    List<List<Effect>> perInput, List<Projections.Prepared> prepared, List<Effect> all, long sourceAfter,
                    Map<StreamPosition, Long> reached, Set<Effect> replacedTimers, EngineState stateAfter,
                    AtomicLong journaledThrough) {
    DecidedBatch(List<Input> inputs, BitSet queued, InputRow progress, List<Instant> times, List<List<Effect>> perInput,
                 List<Projections.Prepared> prepared, List<Effect> all, long sourceAfter, Map<StreamPosition, Long> reached) {
        this(inputs, queued, progress, times, perInput, prepared, all, sourceAfter, reached, TimerOps.superseded(all), null,
                new AtomicLong());
    }

    int size() {
        return inputs.size();
    }

    /**
     * This batch carrying the engine's state once it is decided, to be the next snapshot when
     * it is committed: the driver goes on deciding instead of waiting for the batches in flight.
     */
    DecidedBatch withStateAfter(EngineState state) {
        return new DecidedBatch(inputs, queued, progress, times, perInput, prepared, all, sourceAfter, reached, replacedTimers,
                java.util.Objects.requireNonNull(state, "state"), journaledThrough);
    }
}
