package dev.tend.store;

import com.fasterxml.jackson.databind.JsonNode;

import java.time.Instant;

/**
 * Receives the entries of a period while the ledger is verified
 * ({@link StoreReader#verifyLedgerFromReading}): what a tally of them needs, the text already
 * parsed. The columns are as stored: an entry that fails verify is handed on as it is.
 */
@FunctionalInterface
public interface LedgerEntryRead {
    /**
     * @param seq    the entry's seq
     * @param at     its time (the at_ns column)
     * @param kind   its kind column (null only in a row changed behind the store's back)
     * @param fields its text parsed; null when the text is not JSON or not an object
     */
    void accept(long seq, Instant at, String kind, JsonNode fields);
}
