package dev.tend.api;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.store.LedgerDraft;

import java.util.List;

/**
 * The write side of the API: hands inputs to the orchestrator's driver thread and waits
 * until they are committed. Thread-safe. Both methods throw {@link DriverUnavailableException}
 * when the driver stopped or did not commit in time.
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
}
