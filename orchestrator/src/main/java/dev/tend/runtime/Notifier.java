package dev.tend.runtime;

import dev.tend.engine.Effect;

/**
 * Told about each page after its ledger entry and outbox row are committed (for a courier to
 * look at the outbox at once). Delivery itself runs from the outbox, never from this call, so
 * a crash between commit and delivery loses nothing. The page id is stable, so a receiver can
 * drop a repeat.
 */
public interface Notifier {
    Notifier NONE = n -> { };

    void send(Effect.Notify notification);
}
