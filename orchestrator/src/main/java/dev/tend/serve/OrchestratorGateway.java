package dev.tend.serve;

import dev.tend.api.DriverUnavailableException;
import dev.tend.api.Gateway;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.runtime.Orchestrator;
import dev.tend.shared.InvalidInputException;
import dev.tend.store.LedgerDraft;

import java.time.Duration;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.BooleanSupplier;

/**
 * The API's {@link Gateway} onto a running {@link Orchestrator}: submit, then wait for the
 * commit, on the calling thread or (events from HTTP) through {@link PendingAnswers}.
 */
final class OrchestratorGateway implements Gateway {
    private static final long SLICE_MS = PendingAnswers.SWEEP_MS;

    private final Orchestrator orchestrator;
    private final BooleanSupplier driverRunning;
    private final Duration timeout;
    private final PendingAnswers answers;

    /**
     * Sweeps the answers of {@link #eventsLater} on {@code sweeper} and tells those it fails on
     * {@code answering} (see {@link PendingAnswers}).
     */
    OrchestratorGateway(Orchestrator orchestrator, BooleanSupplier driverRunning, Duration timeout,
                        java.util.concurrent.ScheduledExecutorService sweeper, java.util.concurrent.Executor answering) {
        this.orchestrator = orchestrator;
        this.driverRunning = driverRunning;
        this.timeout = timeout;
        this.answers = new PendingAnswers(driverRunning, timeout, System::nanoTime, answering).sweepOn(sweeper);
    }

    @Override
    public List<Effect> command(Input.Command command) {
        requireRunning();
        return await(orchestrator.submitAndWait(command), "the " + command.kind() + " command");
    }

    /** {@link #eventsLater}, waited for: its answer already fails after the timeout or when the driver stops. */
    @Override
    public void events(List<Input> events, LedgerDraft receipt) {
        try {
            eventsLater(events, receipt).join();
        } catch (java.util.concurrent.CompletionException e) {
            throw e.getCause() instanceof RuntimeException r ? r : e;
        }
    }

    @Override
    public CompletableFuture<Void> eventsLater(List<Input> events, LedgerDraft receipt) {
        if (events.isEmpty()) return CompletableFuture.completedFuture(null);
        requireRunning();
        try {
            for (int i = 0; i < events.size() - 1; i++) orchestrator.submitEvent(events.get(i));
            return answers.track(orchestrator.submitEventAndWait(events.get(events.size() - 1), receipt), events.size());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new DriverUnavailableException("interrupted while queueing events; some may have been applied", e);
        }
    }

    /** What a caller is told when the commit of {@code what} failed with {@code failure}. */
    static RuntimeException asAnswer(Throwable failure, String what) {
        Throwable cause = failure instanceof java.util.concurrent.CompletionException && failure.getCause() != null
                ? failure.getCause() : failure;
        if (cause instanceof InvalidInputException refused) return refused;
        return new DriverUnavailableException("the orchestrator could not commit " + what + ": " + cause.getMessage(), cause);
    }

    private List<Effect> await(CompletableFuture<List<Effect>> f, String what) {
        long deadline = System.nanoTime() + timeout.toNanos();
        try {
            while (true) {
                try {
                    return f.get(SLICE_MS, TimeUnit.MILLISECONDS);
                } catch (TimeoutException slice) {
                    if (!driverRunning.getAsBoolean()) {
                        throw new DriverUnavailableException("the orchestrator stopped before committing " + what
                                + "; see the server's log");
                    }
                    if (System.nanoTime() > deadline) {
                        throw new DriverUnavailableException("the orchestrator did not commit " + what + " within "
                                + timeout.toSeconds() + "s; it may still apply it: look in the ledger before trying again");
                    }
                }
            }
        } catch (ExecutionException e) {
            throw asAnswer(e.getCause(), what);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new DriverUnavailableException("interrupted while waiting for " + what + " to be committed", e);
        }
    }

    private void requireRunning() {
        if (!driverRunning.getAsBoolean()) {
            throw new DriverUnavailableException("the orchestrator has stopped; see the server's log, then start tend serve again");
        }
    }
}
