package dev.tend.runtime;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;

import java.util.List;

/**
 * Told about every batch of inputs after it was committed and its side effects were
 * started, in the order of the batches. Called on the driver thread, which is the one thread
 * allowed to read the engine: a listener may read {@code engine} during the call, and must
 * publish anything other threads need as an immutable copy. The engine may already hold the
 * decisions of the next batch (decided while this one was committed, its commit under way;
 * should that commit fail, the engine is rebuilt and its inputs are told about again one by
 * one, or refused). It must return quickly; an exception it throws stops the driver like a
 * failed commit would.
 */
@FunctionalInterface
public interface CommitListener {
    /** Listens to nothing. */
    CommitListener NONE = (engine, inputs, effects) -> { };

    /** {@code inputs} in the order handled; {@code effects} all their effects, in the same order. */
    void committed(Engine engine, List<Input> inputs, List<Effect> effects);

    /**
     * {@code input} was refused: what it carries could not be decided or kept, and a ledger
     * entry {@code input-refused} names it; the driver goes on with the next input.
     */
    default void refused(Input input, String reason) {
    }
}
