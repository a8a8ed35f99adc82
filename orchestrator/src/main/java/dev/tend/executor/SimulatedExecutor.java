package dev.tend.executor;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.playbooks.SimulatedAction;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;

/**
 * Answers simulated actions after their (seeded) duration, in wall time divided by
 * {@code speedup} (a speedup of 60 runs a one-minute action in one second). Asking again
 * by key gives the same outcome, so an in-flight call is always safe to ask again.
 */
public final class SimulatedExecutor implements Executor {
    private final long seed;
    private final double speedup;
    private final ScheduledExecutorService timer = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "tend-simulated");
        t.setDaemon(true);
        return t;
    });

    public SimulatedExecutor(long seed, double speedup) {
        if (!(speedup > 0)) throw new IllegalArgumentException("speedup must be above 0, got " + speedup);
        this.seed = seed;
        this.speedup = speedup;
    }

    @Override
    public String kind() {
        return "simulated";
    }

    @Override
    public boolean canAskAgain(Effect.CallExecutor call) {
        return true;
    }

    @Override
    public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
        SimulatedAction a = (SimulatedAction) call.action();
        SimulatedOutcome o = SimulatedOutcome.of(seed, call.key(), a);
        long delay = (long) (o.duration().toMillis() / speedup);
        timer.schedule(() -> done.accept(new Input.ExecutorResult(call.runId(), call.stepId(), call.attempt(), o.success(),
                o.success() ? "simulated success" : "simulated failure",
                o.success() ? a.clears() : List.of(),
                Map.of("simulated_ms", o.duration().toMillis()))), delay, TimeUnit.MILLISECONDS);
    }

    public static Duration scaled(Duration d, double speedup) {
        return Duration.ofMillis((long) (d.toMillis() / speedup));
    }

    @Override
    public void close() {
        timer.shutdownNow();
    }
}
