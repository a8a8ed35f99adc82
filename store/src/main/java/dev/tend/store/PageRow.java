package dev.tend.store;

import java.time.Instant;
import java.util.Objects;
import java.util.Set;

/**
 * One page in the outbox: written with its {@code notification} ledger entry, kept until
 * its channel accepted it ({@link #DELIVERED}) or delivery was given up ({@link #FAILED}).
 *
 * @param id         the page's stable id (the receiver's de-duplication key)
 * @param channel    the channel's name
 * @param createdAt  when the page was ledgered
 * @param payload    the page's fields as a JSON object (id, channel, at, kind, message, ...)
 * @param state      one of {@link #STATES}
 * @param attempts   delivery attempts made so far
 * @param nextAt     when a pending page is due to be tried (again)
 * @param lastAnswer the receiver's last answer (status, reply, error), or null before the first attempt
 * @param endedAt    when it was delivered or given up; null while pending
 */
public record PageRow(String id, String channel, Instant createdAt, String payload, String state, int attempts,
                      Instant nextAt, String lastAnswer, Instant endedAt) {
    public static final String PENDING = "pending";
    public static final String DELIVERED = "delivered";
    public static final String FAILED = "failed";
    public static final Set<String> STATES = Set.of(PENDING, DELIVERED, FAILED);

    public PageRow {
        Objects.requireNonNull(id, "PageRow.id must not be null");
        Objects.requireNonNull(channel, "PageRow.channel must not be null");
        Objects.requireNonNull(createdAt, "PageRow.createdAt must not be null");
        Objects.requireNonNull(payload, "PageRow.payload must not be null");
        if (!STATES.contains(state)) throw new IllegalArgumentException("PageRow.state must be pending, delivered or failed, got '" + state + "'");
        if (attempts < 0) throw new IllegalArgumentException("PageRow.attempts must not be negative, got " + attempts);
        Objects.requireNonNull(nextAt, "PageRow.nextAt must not be null");
    }

    /** A page just ledgered: pending, due at once. */
    public static PageRow pending(String id, String channel, Instant at, String payload) {
        return new PageRow(id, channel, at, payload, PENDING, 0, at, null, null);
    }

    /** The same page after an attempt that did not deliver it; tried again at {@code next}. */
    public PageRow retryAt(Instant next, String answer) {
        return new PageRow(id, channel, createdAt, payload, PENDING, attempts + 1, next, answer, null);
    }

    /** The same page after an attempt that ended it: {@code state} delivered or failed. */
    public PageRow ended(String state, Instant at, String answer) {
        return new PageRow(id, channel, createdAt, payload, state, attempts + 1, nextAt, answer, at);
    }
}
