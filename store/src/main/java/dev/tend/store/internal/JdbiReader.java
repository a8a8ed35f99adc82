package dev.tend.store.internal;

import dev.tend.shared.ApprovalState;
import dev.tend.store.ApprovalRow;
import dev.tend.store.ExclusionRow;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerEntryRead;
import dev.tend.store.LedgerFilter;
import dev.tend.store.LedgerPeriodQuery;
import dev.tend.store.LedgerVerification;
import dev.tend.store.PageRow;
import dev.tend.store.RunFilter;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;
import dev.tend.store.StoreException;
import dev.tend.store.StoreReader;
import dev.tend.store.TimerRow;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.statement.Query;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import java.util.function.Consumer;

/** {@link StoreReader} over one Jdbi handle inside a transaction; see Store for the rules. */
public class JdbiReader implements StoreReader {
    /** Rows fetched per round trip when streaming (PostgreSQL streams only with a fetch size). */
    static final int FETCH_SIZE = 1000;

    protected final Handle handle;
    protected final String location;
    private boolean ended;

    public JdbiReader(Handle handle, String location) {
        this.handle = handle;
        this.location = location;
    }

    /** Called before every read; a transaction sends its batched writes here. */
    protected void beforeRead() {
        requireOpen();
    }

    protected final void requireOpen() {
        if (ended) {
            throw new StoreException(location, "this store callback has returned, so its reader or transaction "
                    + "can no longer be used; do the work inside the callback");
        }
    }

    /** Marks the callback as returned: every later call throws. */
    public void end() {
        ended = true;
    }

    @Override
    public void forEachInput(long afterSeq, Consumer<InputRow> consumer) {
        Objects.requireNonNull(consumer, "consumer");
        beforeRead();
        handle.createQuery("SELECT " + Rows.INPUT_COLUMNS + " FROM input_journal WHERE seq > :after ORDER BY seq")
                .bind("after", afterSeq)
                .setFetchSize(FETCH_SIZE)
                .map((rs, ctx) -> Rows.input(rs))
                .forEach(consumer);
    }

    @Override
    public long lastInputSeq() {
        beforeRead();
        return handle.createQuery("SELECT COALESCE(MAX(seq), 0) FROM input_journal").mapTo(Long.class).one();
    }

    @Override
    public long firstInputSeq() {
        beforeRead();
        return handle.createQuery("SELECT COALESCE(MIN(seq), 0) FROM input_journal").mapTo(Long.class).one();
    }

    @Override
    public java.util.Map<Integer, Long> streamOffsets(String topic) {
        Objects.requireNonNull(topic, "topic");
        beforeRead();
        java.util.Map<Integer, Long> out = new java.util.TreeMap<>();
        handle.createQuery("SELECT part, next_offset FROM stream_offsets WHERE topic = :topic")
                .bind("topic", topic)
                .map((rs, ctx) -> java.util.Map.entry(rs.getInt(1), rs.getLong(2)))
                .forEach(e -> out.put(e.getKey(), e.getValue()));
        return java.util.Collections.unmodifiableMap(out);
    }

    @Override
    public Optional<dev.tend.store.SnapshotRow> latestSnapshot() {
        beforeRead();
        return handle.createQuery("SELECT seq, taken_ns, format, setup, body FROM snapshots ORDER BY seq DESC LIMIT 1")
                .map((rs, ctx) -> new dev.tend.store.SnapshotRow(rs.getLong(1), Times.fromNanos(rs.getLong(2)), rs.getInt(3),
                        rs.getString(4), rs.getBytes(5)))
                .findOne();
    }

    @Override
    public List<RunRow> runs(RunFilter filter) {
        Objects.requireNonNull(filter, "filter");
        beforeRead();
        StringBuilder sql = new StringBuilder("SELECT " + Rows.RUN_COLUMNS + " FROM runs WHERE 1 = 1");
        if (filter.activeOnly()) sql.append(" AND ended_ns IS NULL");
        if (filter.cluster() != null) sql.append(" AND cluster = :cluster");
        if (filter.playbook() != null) sql.append(" AND playbook = :playbook");
        if (filter.since() != null) sql.append(" AND created_ns >= :since");
        sql.append(" ORDER BY created_ns DESC, run_id DESC");
        if (filter.limit() > 0) sql.append(" LIMIT ").append(filter.limit());
        Query q = handle.createQuery(sql.toString());
        if (filter.cluster() != null) q.bind("cluster", filter.cluster());
        if (filter.playbook() != null) q.bind("playbook", filter.playbook());
        if (filter.since() != null) q.bind("since", Times.toNanos(filter.since(), "RunFilter.since"));
        return List.copyOf(q.map((rs, ctx) -> Rows.run(rs)).list());
    }

    @Override
    public Optional<RunRow> run(String runId) {
        Objects.requireNonNull(runId, "runId");
        beforeRead();
        return handle.createQuery("SELECT " + Rows.RUN_COLUMNS + " FROM runs WHERE run_id = :id")
                .bind("id", runId)
                .map((rs, ctx) -> Rows.run(rs))
                .findOne();
    }

    @Override
    public List<StepRow> steps(String runId) {
        Objects.requireNonNull(runId, "runId");
        beforeRead();
        return List.copyOf(handle.createQuery("SELECT " + Rows.STEP_COLUMNS + " FROM steps WHERE run_id = :id ORDER BY ordinal, step_id")
                .bind("id", runId)
                .map((rs, ctx) -> Rows.step(rs))
                .list());
    }

    @Override
    public List<TimerRow> timers() {
        beforeRead();
        return List.copyOf(handle.createQuery("SELECT " + Rows.TIMER_COLUMNS + " FROM timers ORDER BY due_ns, timer_key")
                .map((rs, ctx) -> Rows.timer(rs))
                .list());
    }

    @Override
    public List<ExclusionRow> exclusions() {
        beforeRead();
        return List.copyOf(handle.createQuery("SELECT " + Rows.EXCLUSION_COLUMNS + " FROM exclusions ORDER BY cluster, node")
                .map((rs, ctx) -> Rows.exclusion(rs))
                .list());
    }

    @Override
    public List<PageRow> pagesDue(Instant now, int limit) {
        beforeRead();
        return List.copyOf(handle.createQuery("SELECT " + Rows.PAGE_COLUMNS + " FROM page_outbox WHERE state = :state"
                        + " AND next_ns <= :now ORDER BY next_ns, id LIMIT :limit")
                .bind("state", PageRow.PENDING)
                .bind("now", Times.toNanos(now, "now"))
                .bind("limit", limit)
                .map((rs, ctx) -> Rows.page(rs)).list());
    }

    @Override
    public List<PageRow> pages(Set<String> states, int limit) {
        for (String s : states) {
            if (!PageRow.STATES.contains(s)) throw new IllegalArgumentException("pages(states) takes pending, delivered or failed, got '" + s + "'");
        }
        if (states.isEmpty()) return List.of();
        beforeRead();
        return List.copyOf(handle.createQuery("SELECT " + Rows.PAGE_COLUMNS + " FROM page_outbox WHERE state IN (<states>)"
                        + " ORDER BY created_ns DESC, id LIMIT :limit")
                .bindList("states", new ArrayList<>(new java.util.TreeSet<>(states)))
                .bind("limit", limit)
                .map((rs, ctx) -> Rows.page(rs)).list());
    }

    @Override
    public Optional<PageRow> page(String id) {
        beforeRead();
        return handle.createQuery("SELECT " + Rows.PAGE_COLUMNS + " FROM page_outbox WHERE id = :id")
                .bind("id", id).map((rs, ctx) -> Rows.page(rs)).findOne();
    }

    @Override
    public List<ApprovalRow> approvals(ApprovalState stateOrNull) {
        beforeRead();
        String where = stateOrNull == null ? "" : " WHERE state = :state";
        Query q = handle.createQuery("SELECT " + Rows.APPROVAL_COLUMNS + " FROM approvals" + where + " ORDER BY requested_ns, run_id");
        if (stateOrNull != null) q.bind("state", stateOrNull.wireName());
        return List.copyOf(q.map((rs, ctx) -> Rows.approval(rs)).list());
    }

    @Override
    public Optional<String> state(String key) {
        Objects.requireNonNull(key, "key");
        beforeRead();
        return handle.createQuery("SELECT json FROM fleet_state WHERE state_key = :key")
                .bind("key", key)
                .mapTo(String.class)
                .findOne();
    }

    @Override
    public void forEachLedger(LedgerFilter filter, Consumer<LedgerEntry> consumer) {
        Objects.requireNonNull(filter, "filter");
        Objects.requireNonNull(consumer, "consumer");
        beforeRead();
        StringBuilder sql = new StringBuilder("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE 1 = 1");
        appendFilter(sql, filter);
        sql.append(" ORDER BY seq");
        Query q = handle.createQuery(sql.toString()).setFetchSize(FETCH_SIZE);
        bindFilter(q, filter);
        q.map((rs, ctx) -> Rows.ledger(rs)).forEach(consumer);
    }

    /**
     * The filter's conditions. Only the most selective column given (run, then cluster, then
     * playbook, then kind) is written so that an index can serve it; the others are written as
     * expressions ({@code col || ''}), which no planner serves from an index: without statistics
     * SQLite may otherwise walk the kind index backwards (half the ledger are verdicts) looking
     * for the few entries of one cluster.
     */
    private static void appendFilter(StringBuilder sql, LedgerFilter filter) {
        if (filter.since() != null) sql.append(" AND at_ns >= :since");
        if (filter.until() != null) sql.append(" AND at_ns < :until");
        boolean served = false;
        String[][] columns = {{"run", filter.run()}, {"cluster", filter.cluster()}, {"playbook", filter.playbook()},
                {"kind", filter.kind()}};
        for (String[] c : columns) {
            if (c[1] == null) continue;
            sql.append(" AND ").append(c[0]).append(served ? " || '' = :" : " = :").append(c[0]);
            served = true;
        }
    }

    private static void bindFilter(Query q, LedgerFilter filter) {
        if (filter.since() != null) q.bind("since", Times.toNanos(filter.since(), "LedgerFilter.since"));
        if (filter.until() != null) q.bind("until", Times.toNanos(filter.until(), "LedgerFilter.until"));
        if (filter.cluster() != null) q.bind("cluster", filter.cluster());
        if (filter.playbook() != null) q.bind("playbook", filter.playbook());
        if (filter.kind() != null) q.bind("kind", filter.kind());
        if (filter.run() != null) q.bind("run", filter.run());
    }

    @Override
    public List<LedgerEntry> newestLedger(LedgerFilter filter, long beforeSeq, int limit) {
        Objects.requireNonNull(filter, "filter");
        if (limit < 1) throw new IllegalArgumentException("newestLedger: limit must be 1 or more, got " + limit);
        beforeRead();
        StringBuilder sql = new StringBuilder("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger WHERE seq < :before");
        if (filter.until() != null && filter.run() == null && filter.cluster() == null && filter.playbook() == null
                && filter.kind() == null) {
            // a span of time that may lie far back: the seqs come from the time index alone (it holds them), sorted,
            // and only the page's rows are read; walking the table back from the newest entry would read every
            // entry after the span
            sql.append(" AND seq IN (SELECT seq FROM ledger WHERE seq < :before");
            appendFilter(sql, filter);
            sql.append(" ORDER BY seq + 0 DESC LIMIT :limit)");
        } else {
            appendFilter(sql, filter);
        }
        sql.append(" ORDER BY seq DESC LIMIT :limit");
        Query q = handle.createQuery(sql.toString()).bind("before", beforeSeq).bind("limit", limit);
        bindFilter(q, filter);
        return List.copyOf(q.map((rs, ctx) -> Rows.ledger(rs)).list());
    }

    @Override
    public void forEachLedgerOfPeriod(LedgerPeriodQuery query, Consumer<LedgerEntry> consumer) {
        Objects.requireNonNull(query, "query");
        Objects.requireNonNull(consumer, "consumer");
        beforeRead();
        new LedgerPeriodRead(handle, query).forEach(consumer);
    }

    @Override
    public LedgerVerification verifyLedgerFromReading(long fromSeq, LedgerPeriodQuery query, LedgerEntryRead consumer) {
        Objects.requireNonNull(query, "query");
        Objects.requireNonNull(consumer, "consumer");
        beforeRead();
        return new LedgerPeriodRead(handle, query).verifyReading(fromSeq, consumer);
    }

    @Override
    public long firstLedgerSeqAt(Instant at) {
        Objects.requireNonNull(at, "at");
        beforeRead();
        // MIN(seq + 0), not MIN(seq): SQLite answers MIN of the key by walking the table from seq 1 until the
        // condition holds (millions of rows); the expression makes it range over the time index instead
        Long seq = handle.createQuery("SELECT MIN(seq + 0) FROM ledger WHERE at_ns >= :at")
                .bind("at", Times.toNanos(at, "at"))
                .mapTo(Long.class).one();
        return seq == null ? 0 : seq;
    }

    @Override
    public LedgerVerification verifyLedgerFrom(long fromSeq) {
        beforeRead();
        return new LedgerVerifier(handle).verifyFrom(fromSeq);
    }

    @Override
    public java.util.SortedSet<String> ledgerKinds() {
        beforeRead();
        // one index probe per distinct kind (a loose index scan) instead of reading every entry
        return new java.util.TreeSet<>(handle.createQuery("WITH RECURSIVE k(kind) AS (SELECT MIN(kind) FROM ledger"
                        + " UNION ALL SELECT (SELECT MIN(kind) FROM ledger WHERE kind > k.kind) FROM k WHERE k.kind IS NOT NULL)"
                        + " SELECT kind FROM k WHERE kind IS NOT NULL")
                .mapTo(String.class).list());
    }

    @Override
    public Optional<LedgerEntry> ledgerHead() {
        beforeRead();
        return handle.createQuery("SELECT " + Rows.LEDGER_COLUMNS + " FROM ledger ORDER BY seq DESC LIMIT 1")
                .map((rs, ctx) -> Rows.ledger(rs))
                .findOne();
    }

    @Override
    public LedgerVerification verifyLedger() {
        beforeRead();
        return new LedgerVerifier(handle).verify();
    }

    @Override
    public void forEachTransitionInput(Instant from, Instant until, Set<String> clusters, Consumer<InputRow> consumer) {
        Objects.requireNonNull(from, "from");
        Objects.requireNonNull(until, "until");
        Objects.requireNonNull(clusters, "clusters (pass an empty set for every cluster)");
        Objects.requireNonNull(consumer, "consumer");
        if (until.isBefore(from)) {
            throw new IllegalArgumentException("forEachTransitionInput: until must not be before from " + from + ", got " + until);
        }
        beforeRead();
        long fromNanos = Times.toNanos(from, "from");
        long untilNanos = Times.toNanos(until, "until");
        // the seq range of the period's hours of event time (EventHours), then the rows in it
        List<Long> range = handle.createQuery("SELECT MIN(first_seq), MAX(last_seq) FROM journal_event_hours"
                        + " WHERE hour >= :first AND hour <= :last")
                .bind("first", EventHours.of(fromNanos))
                .bind("last", EventHours.of(untilNanos))
                .map((rs, ctx) -> rs.getObject(1) == null ? null : List.of(rs.getLong(1), rs.getLong(2)))
                .one();
        if (range == null) return;
        List<String> names = new ArrayList<>(clusters);
        StringBuilder sql = new StringBuilder("SELECT " + Rows.INPUT_COLUMNS + " FROM input_journal"
                + " WHERE seq >= :low AND seq <= :high"
                + " AND kind IN ('transition', 'topology') AND event_at_ns >= :from AND event_at_ns < :until");
        if (!names.isEmpty()) sql.append(" AND cluster IN (<clusters>)");
        sql.append(" ORDER BY seq");
        Query q = handle.createQuery(sql.toString())
                .bind("low", range.get(0))
                .bind("high", range.get(1))
                .bind("from", fromNanos)
                .bind("until", untilNanos)
                .setFetchSize(FETCH_SIZE);
        if (!names.isEmpty()) q.bindList("clusters", names);
        q.map((rs, ctx) -> Rows.input(rs)).forEach(consumer);
    }
}
