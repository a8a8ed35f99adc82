package dev.tend.runtime;

import dev.tend.engine.Effect;

/**
 * Delivers notifications. Called after the notification's ledger entry is committed; the
 * notification id is stable, so a receiver can drop a repeat.
 */
public interface Notifier {
    void send(Effect.Notify notification);

    /** Writes each notification as one line to a stream (stderr by default). */
    static Notifier printingTo(java.io.PrintStream out) {
        return n -> out.println("tend: page " + n.channel() + ": " + n.message());
    }
}
