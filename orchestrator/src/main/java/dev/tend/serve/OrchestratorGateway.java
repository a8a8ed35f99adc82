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

/** The API's {@link Gateway} onto a running {@link Orchestrator}: submit, then wait for the commit. */
final class OrchestratorGateway implements Gateway {
    private static final long SLICE_MS = 200;

    private final Orchestrator orchestrator;
    private final BooleanSupplier driverRunning;
    private final Duration timeout;

    OrchestratorGateway(Orchestrator orchestrator, BooleanSupplier driverRunning, Duration timeout) {
        this.orchestrator = orchestrator;
        this.driverRunning = driverRunning;
        this.timeout = timeout;
    }

    @Override
    public List<Effect> command(Input.Command command) {
        requireRunning();
        return await(orchestrator.submitAndWait(command), "the " + command.kind() + " command");
    }

    @Override
    public void events(List<Input> events, LedgerDraft receipt) {
        if (events.isEmpty()) return;
        requireRunning();
        try {
            for (int i = 0; i < events.size() - 1; i++) orchestrator.submitEvent(events.get(i));
            await(orchestrator.submitEventAndWait(events.get(events.size() - 1), receipt), events.size() + " event(s)");
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new DriverUnavailableException("interrupted while queueing events; some may have been applied", e);
        }
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
            if (e.getCause() instanceof InvalidInputException refused) throw refused;
            throw new DriverUnavailableException("the orchestrator could not commit " + what + ": " + e.getCause().getMessage(), e);
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
