package dev.tend.store;

import java.time.Instant;
import java.util.Objects;
import java.util.Set;

/**
 * What a report of the period {@code [since, until)} reads of the ledger
 * ({@link StoreReader#forEachLedgerOfPeriod}): every entry of the period, and of the entries
 * before it only those that carry state into it: entries of {@code carriedKinds} (say, the
 * brake's), and every entry of a run still open when the period begins. A run is open at
 * {@code since} when an entry of one of {@code openingKinds} names it before {@code since} and
 * no entry of {@code closingKinds} does. The store knows no kinds; the reader of the report
 * names them.
 *
 * @param since        the first instant of the period
 * @param until        the first instant after it, after {@code since}
 * @param carriedKinds kinds read from the whole ledger before the period
 * @param openingKinds kinds whose entries open a run (by their {@code run} column)
 * @param closingKinds kinds whose entries close a run
 */
public record LedgerPeriodQuery(Instant since, Instant until, Set<String> carriedKinds, Set<String> openingKinds,
                                Set<String> closingKinds) {
    public LedgerPeriodQuery {
        Objects.requireNonNull(since, "LedgerPeriodQuery.since must not be null");
        Objects.requireNonNull(until, "LedgerPeriodQuery.until must not be null");
        if (!until.isAfter(since)) {
            throw new IllegalArgumentException("LedgerPeriodQuery.until must be after since " + since + ", got " + until);
        }
        carriedKinds = Set.copyOf(Objects.requireNonNull(carriedKinds, "LedgerPeriodQuery.carriedKinds must not be null"));
        openingKinds = Set.copyOf(Objects.requireNonNull(openingKinds, "LedgerPeriodQuery.openingKinds must not be null"));
        closingKinds = Set.copyOf(Objects.requireNonNull(closingKinds, "LedgerPeriodQuery.closingKinds must not be null"));
        if (openingKinds.isEmpty() || closingKinds.isEmpty()) {
            throw new IllegalArgumentException("LedgerPeriodQuery.openingKinds and closingKinds must each name a kind, got "
                    + openingKinds + " and " + closingKinds);
        }
    }
}
