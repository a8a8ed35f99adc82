package dev.tend.metrics;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.executor.Executor;

import java.time.Duration;
import java.util.Objects;
import java.util.function.Consumer;

/** An executor that reports how long each call took to {@link TendMetrics}; otherwise the one it wraps. */
public final class TimedExecutor implements Executor {
    private final Executor inner;
    private final TendMetrics metrics;

    public TimedExecutor(Executor inner, TendMetrics metrics) {
        this.inner = Objects.requireNonNull(inner, "inner");
        this.metrics = Objects.requireNonNull(metrics, "metrics");
    }

    @Override
    public String kind() {
        return inner.kind();
    }

    @Override
    public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
        long t0 = System.nanoTime(); // measuring, not deciding: a monotonic clock is right here
        inner.execute(call, result -> {
            metrics.executorAnswered(inner.kind(), result.success(), Duration.ofNanos(System.nanoTime() - t0));
            done.accept(result);
        });
    }

    @Override
    public boolean canAskAgain(Effect.CallExecutor call) {
        return inner.canAskAgain(call);
    }

    @Override
    public void close() {
        inner.close();
    }
}
