package dev.tend.page;

/**
 * Delivers pages to one channel. {@link #send} blocks until the receiver answered, a timeout
 * passed or the attempt failed; it never throws for the receiver's failures (they are
 * answers). Implementations are thread-safe.
 */
public interface PageSender {
    /** webhook, email, command or log. */
    String kind();

    Answer send(Page page);
}
