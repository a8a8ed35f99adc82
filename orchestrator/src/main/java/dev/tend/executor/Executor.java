package dev.tend.executor;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;

import java.util.function.Consumer;

/**
 * Performs an action for a run and reports the result as an engine input. Calls return at
 * once; the result arrives later on {@code done}, from any thread. Implementations must be
 * idempotent by {@link Effect.CallExecutor#key()} where {@link #canAskAgain} says so.
 */
public interface Executor extends AutoCloseable {
    /** The action kind this executor serves: {@code command}, {@code http}, {@code simulated}. */
    String kind();

    void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done);

    /**
     * True when calling again with the same key after a crash cannot repeat the side effect,
     * so an in-flight call may be asked again; false makes the run stop and ask a person.
     */
    boolean canAskAgain(Effect.CallExecutor call);

    @Override
    default void close() {
    }
}
