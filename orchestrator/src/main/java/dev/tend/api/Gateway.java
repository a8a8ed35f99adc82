package dev.tend.api;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.LedgerDraft;

import java.util.List;
import java.util.concurrent.CompletableFuture;

/**
 * The write side of the API: hands inputs to the orchestrator's driver thread and waits
 * until they are committed. Thread-safe. Each method throws {@link DriverUnavailableException}
 * (or completes with it) when the driver stopped or did not commit in time.
 */
public interface Gateway {
    /** Applies an operator command; returns its effects once committed. */
    List<Effect> command(Input.Command command);

    /**
     * Queues transitions and topology events in order; returns once all are committed, with
     * {@code receipt} (who sent them) in the ledger right after the last one's entries, in
     * the same transaction.
     */
    void events(List<Input> events, LedgerDraft receipt);

    /**
     * As {@link #events}, without holding the calling thread: queues the events (throwing at
     * once when they cannot be queued) and returns a future that completes once all are
     * committed, or exceptionally as {@link #events} would have thrown. The HTTP route answers
     * from it, so a request thread does not sleep through the commit (DEVELOPERS.md, "Live").
     */
    default CompletableFuture<Void> eventsLater(List<Input> events, LedgerDraft receipt) {
        events(events, receipt);
        return CompletableFuture.completedFuture(null);
    }
}
