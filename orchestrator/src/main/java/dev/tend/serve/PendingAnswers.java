package dev.tend.serve;

import dev.tend.api.DriverUnavailableException;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.Executor;
import java.util.concurrent.RejectedExecutionException;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.BooleanSupplier;
import java.util.function.LongSupplier;

/**
 * The answers of {@link OrchestratorGateway#eventsLater} that wait for their commit, with the
 * rules a waiting request thread used to apply itself: an answer whose commit did not come
 * within the timeout fails ("it may still apply it"), and every answer fails as soon as the
 * driver is found stopped. One sweep every {@link #SWEEP_MS} looks at them; answers are kept
 * in the order taken, which is the order of their deadlines, so a sweep stops at the first
 * one still in time. Thread-safe.
 */
final class PendingAnswers {
    /** How often the sweep runs: how late a timed-out answer may be, at most. */
    static final long SWEEP_MS = 200;

    private record Waiting(long deadlineNanos, CompletableFuture<Void> answer, int events) {
    }

    private final ConcurrentLinkedQueue<Waiting> waiting = new ConcurrentLinkedQueue<>();
    private final BooleanSupplier driverRunning;
    private final Duration timeout;
    private final LongSupplier nanos;
    /** Where the answers failed by a sweep are told: what a caller does then (writing a 503) never holds the sweep. */
    private final Executor tellOn;

    PendingAnswers(BooleanSupplier driverRunning, Duration timeout, LongSupplier nanos, Executor tellOn) {
        this.driverRunning = Objects.requireNonNull(driverRunning, "driverRunning");
        if (timeout.isNegative() || timeout.isZero()) throw new IllegalArgumentException("timeout must be positive, got " + timeout);
        this.timeout = timeout;
        this.nanos = Objects.requireNonNull(nanos, "nanos");
        this.tellOn = Objects.requireNonNull(tellOn, "tellOn");
    }

    /** Sweeps on {@code on} every {@link #SWEEP_MS} until it is shut down. */
    PendingAnswers sweepOn(ScheduledExecutorService on) {
        on.scheduleWithFixedDelay(this::sweep, SWEEP_MS, SWEEP_MS, TimeUnit.MILLISECONDS);
        return this;
    }

    /**
     * The answer to {@code events} events whose commit {@code committed} says: it completes
     * when they are committed, or fails as {@link OrchestratorGateway#events} would have thrown.
     */
    CompletableFuture<Void> track(CompletableFuture<?> committed, int events) {
        CompletableFuture<Void> answer = new CompletableFuture<>();
        committed.whenComplete((fx, failure) -> {
            if (failure == null) answer.complete(null);
            else answer.completeExceptionally(OrchestratorGateway.asAnswer(failure, events + " event(s)"));
        });
        if (!answer.isDone()) waiting.add(new Waiting(nanos.getAsLong() + timeout.toNanos(), answer, events));
        return answer;
    }

    /** Answers still waiting (tests). */
    int size() {
        waiting.removeIf(w -> w.answer().isDone());
        return waiting.size();
    }

    /** Drops the answers given, fails those past their deadline, or all of them when the driver stopped. */
    void sweep() {
        boolean stopped = !driverRunning.getAsBoolean();
        long now = nanos.getAsLong();
        List<Runnable> failing = new ArrayList<>();
        for (Waiting w = waiting.peek(); w != null; w = waiting.peek()) {
            if (!w.answer().isDone()) {
                if (!stopped && now - w.deadlineNanos() <= 0) break; // the ones after it were taken later: later deadlines
                String why = stopped
                        ? "the orchestrator stopped before committing " + w.events() + " event(s); see the server's log"
                        : "the orchestrator did not commit " + w.events() + " event(s) within " + timeout.toSeconds()
                        + "s; it may still apply it: look in the ledger before trying again";
                CompletableFuture<Void> answer = w.answer();
                failing.add(() -> answer.completeExceptionally(new DriverUnavailableException(why)));
            }
            waiting.poll();
        }
        if (failing.isEmpty()) return;
        Runnable tell = () -> failing.forEach(Runnable::run);
        try {
            tellOn.execute(tell);
        } catch (RejectedExecutionException shutDown) {
            tell.run();
        }
    }
}
