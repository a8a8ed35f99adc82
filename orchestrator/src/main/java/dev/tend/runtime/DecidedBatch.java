package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.InputRow;

import java.time.Instant;
import java.util.BitSet;
import java.util.List;
import java.util.Map;

/**
 * A batch the driver decided and has not yet acted on: its inputs (with the clears the
 * simulated fleet reported queued behind their results), which of them came from the events
 * queue, the input file's progress row (null: none), when and with what effects each input
 * was decided, what their effects write that could be made ahead ({@link Projections.Prepared}),
 * how many events of the input file are done once it is committed, and the stream positions
 * it reaches. Written by {@link CommitWriter#batch}; its effects are performed only after that.
 */
record DecidedBatch(List<Input> inputs, BitSet queued, InputRow progress, List<Instant> times,
                    List<List<Effect>> perInput, List<Projections.Prepared> prepared, List<Effect> all, long sourceAfter,
                    Map<StreamPosition, Long> reached) {
    int size() {
        return inputs.size();
    }
}
