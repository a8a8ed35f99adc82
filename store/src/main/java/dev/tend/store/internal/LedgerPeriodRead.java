package dev.tend.store.internal;

import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerEntryRead;
import dev.tend.store.LedgerPeriodQuery;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.statement.Query;

import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.function.Consumer;
import java.util.stream.IntStream;

/**
 * What a report of a period reads of the ledger ({@link LedgerPeriodQuery}): the few entries
 * before the period that carry state into it, and the period's own entries in seq order,
 * merged by seq. Either read on their own ({@link #forEach}), or the period's entries taken
 * from the verifier's walk from the period's first entry ({@link #verifyReading}), so that each
 * is read and parsed once.
 */
final class LedgerPeriodRead {
    private final Handle handle;
    private final long since;
    private final long until;
    private final LedgerPeriodQuery query;
    private List<RawLedgerRow> carried;
    private int next;

    LedgerPeriodRead(Handle handle, LedgerPeriodQuery query) {
        this.handle = handle;
        this.query = query;
        this.since = Times.toNanos(query.since(), "LedgerPeriodQuery.since");
        this.until = Times.toNanos(query.until(), "LedgerPeriodQuery.until");
    }

    /**
     * Before the period: the carried kinds, and every entry of a run still open at since (few, in
     * seq order). Their seqs come from the indexes alone (ledger_kind_time, ledger_run), then the
     * rows by seq in order, so that no row is sorted. A tally of them reads only their seq, time,
     * kind and text ({@code everyColumn} false; the other columns are then null): each column is
     * a call into SQLite per row, and these rows are read before the walk can begin.
     */
    private List<RawLedgerRow> carried(boolean everyColumn) {
        String openRuns = "SELECT run FROM ledger WHERE kind IN (<opening>) AND at_ns < :since AND run IS NOT NULL"
                + " EXCEPT SELECT run FROM ledger WHERE kind IN (<closing>) AND at_ns < :since AND run IS NOT NULL";
        String seqs = "SELECT seq FROM ledger WHERE run IN (" + openRuns + ") AND at_ns < :since";
        if (!query.carriedKinds().isEmpty()) {
            seqs = seqs + " UNION ALL SELECT seq FROM ledger WHERE kind IN (<carried>) AND at_ns < :since";
        }
        String columns = everyColumn ? Rows.LEDGER_COLUMNS : "seq, at_ns, kind, entry";
        Query carriedQuery = handle.createQuery("SELECT " + columns + " FROM ledger WHERE seq IN (" + seqs + ") ORDER BY seq")
                .bind("since", since)
                .bindList("opening", List.copyOf(query.openingKinds()))
                .bindList("closing", List.copyOf(query.closingKinds()));
        if (!query.carriedKinds().isEmpty()) carriedQuery.bindList("carried", List.copyOf(query.carriedKinds()));
        return everyColumn ? carriedQuery.map((rs, ctx) -> RawLedgerRow.of(rs)).list()
                : carriedQuery.map((rs, ctx) -> new RawLedgerRow(rs.getLong(1), rs.getLong(2), rs.getBytes(3), null, null, null,
                        rs.getBytes(4), null, null)).list();
    }

    /** The lowest and highest seq of an entry in the period (through the time index); {0, 0} when it has none. */
    long[] range() {
        return handle.createQuery("SELECT MIN(seq), MAX(seq) FROM ledger WHERE at_ns >= :since AND at_ns < :until")
                .bind("since", since).bind("until", until)
                .map((rs, ctx) -> new long[]{rs.getLong(1), rs.getLong(2)}).one();
    }

    /** Hands every entry of the query to {@code consumer} in seq order. */
    void forEach(Consumer<LedgerEntry> consumer) {
        carried = carried(true);
        long[] range = range();
        if (range[1] > 0) {
            try (var rows = handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq >= :lo AND seq <= :hi"
                            + " AND at_ns >= :since AND at_ns < :until ORDER BY seq")
                    .bind("lo", range[0]).bind("hi", range[1]).bind("since", since).bind("until", until)
                    .setFetchSize(JdbiReader.FETCH_SIZE)
                    .map((rs, ctx) -> Rows.ledger(rs)).iterator()) {
                while (rows.hasNext()) {
                    LedgerEntry e = rows.next();
                    carriedBefore(e.seq(), consumer);
                    consumer.accept(e);
                }
            }
        }
        carriedBefore(Long.MAX_VALUE, consumer);
    }

    private void carriedBefore(long seq, Consumer<LedgerEntry> consumer) {
        while (next < carried.size() && carried.get(next).seq() < seq) {
            RawLedgerRow r = carried.get(next++);
            consumer.accept(new LedgerEntry(r.seq(), Times.fromNanos(r.atNs()), r.kind(), r.cluster(), r.playbook(), r.run(),
                    RawLedgerRow.text(r.entry()), RawLedgerRow.text(r.prevHash()), RawLedgerRow.text(r.hash())));
        }
    }

    /** The carried entries before {@code seq}, their text parsed (the usual one in one pass, as the walk does). */
    private void carriedBefore(long seq, JsonNode[] fields, LedgerEntryRead consumer) {
        while (next < carried.size() && carried.get(next).seq() < seq) {
            RawLedgerRow r = carried.get(next);
            consumer.accept(r.seq(), Times.fromNanos(r.atNs()), r.kind(), fields[next++]);
        }
    }

    /** The carried entries' texts parsed, on the pool (they are parsed while the walk reads its first rows). */
    private CompletableFuture<JsonNode[]> parseCarried() {
        return CompletableFuture.supplyAsync(() -> {
            JsonNode[] fields = new JsonNode[carried.size()];
            IntStream.range(0, fields.length).parallel().forEach(i -> fields[i] = LedgerVerifier.fields(carried.get(i).entry()));
            return fields;
        });
    }

    /**
     * Verifies from {@code fromSeq} (as {@link LedgerVerifier#verifyFrom(long)}) and hands every
     * entry of the query to {@code consumer} in seq order with its text parsed (null when the
     * text is not a JSON object), in one walk: the period's entries are those of the walk whose
     * time lies in it. A period whose first entry comes before {@code fromSeq} is read on its own.
     */
    dev.tend.store.LedgerVerification verifyReading(long fromSeq, LedgerEntryRead consumer) {
        Consumer<LedgerEntry> parsed = e -> consumer.accept(e.seq(), e.at(), e.kind(), LedgerVerifier.fields(e.entry()));
        long[] range = range();
        if (range[1] > 0 && range[0] < Math.max(1, fromSeq)) {
            forEach(parsed);
            return new LedgerVerifier(handle).verifyFrom(fromSeq);
        }
        carried = carried(false);
        CompletableFuture<JsonNode[]> parsing = parseCarried();
        dev.tend.store.LedgerVerification v = new LedgerVerifier(handle).verifyFrom(fromSeq, (row, kind, fields) -> {
            if (row.atNs() < since || row.atNs() >= until) return;
            carriedBefore(row.seq(), parsing.join(), consumer);
            consumer.accept(row.seq(), Times.fromNanos(row.atNs()), kind, fields);
        });
        carriedBefore(Long.MAX_VALUE, parsing.join(), consumer);
        return v;
    }
}
