package dev.tend.store;

import java.time.Instant;
import java.util.Objects;

/**
 * Receipts of one caller's requests that are counted but not yet in the ledger (table
 * {@code open_receipts}): committed with the events they carried, and appended to the
 * ledger as one entry when they are closed. Adding receipts of the same {@code kind} and
 * {@code caller} sums the counts and widens {@code first}..{@code last}.
 *
 * @param kind     the ledger kind of the entry they become
 * @param caller   the entry's fields other than its counts, as one text (the key receipts fold on)
 * @param accepted lines applied
 * @param rejected lines refused
 * @param requests requests counted, at least one
 * @param first    when the first of them was received
 * @param last     when the last of them was received (the entry's time)
 */
public record OpenReceipt(String kind, String caller, long accepted, long rejected, long requests, Instant first, Instant last) {
    public OpenReceipt {
        Objects.requireNonNull(kind, "OpenReceipt.kind must not be null");
        if (kind.isBlank()) throw new IllegalArgumentException("OpenReceipt.kind must not be blank");
        Objects.requireNonNull(caller, "OpenReceipt.caller must not be null");
        if (accepted < 0 || rejected < 0) {
            throw new IllegalArgumentException("OpenReceipt counts must be 0 or more, got accepted " + accepted + " and rejected " + rejected);
        }
        if (requests < 1) throw new IllegalArgumentException("OpenReceipt.requests must be at least 1, got " + requests);
        Objects.requireNonNull(first, "OpenReceipt.first must not be null");
        Objects.requireNonNull(last, "OpenReceipt.last must not be null");
        if (last.isBefore(first)) throw new IllegalArgumentException("OpenReceipt.last " + last + " is before first " + first);
    }
}
