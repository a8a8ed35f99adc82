package dev.tend.store.internal;

import dev.tend.store.ApprovalRow;
import dev.tend.store.PageRow;
import dev.tend.store.ExclusionRow;
import dev.tend.store.InputRow;
import dev.tend.store.LedgerDraft;
import dev.tend.store.LedgerEntry;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;
import dev.tend.store.StoreTx;
import dev.tend.store.TimerRow;
import org.jdbi.v3.core.Handle;
import org.jdbi.v3.core.statement.PreparedBatch;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * {@link StoreTx} over one Jdbi handle inside a transaction. Journal and ledger appends
 * are numbered and hashed in memory at once and sent as prepared batches of up to
 * {@link #BATCH} rows, before any read and before commit.
 */
public final class JdbiTx extends JdbiReader implements StoreTx {
    static final int BATCH = 2048;
    private static final RowInserts<List<LedgerEntry>> LEDGER = new RowInserts<>("ledger", Rows.LEDGER_COLUMNS, 9,
            (ps, first, entries, i) -> bindLedger(ps, first, entries.get(i)));
    private static final String UPDATE_HEAD = "UPDATE ledger_head SET seq = ?, hash = ? WHERE id = 1";
    private static final String ARM_TIMER = "INSERT INTO timers (" + Rows.TIMER_COLUMNS + ") VALUES (?, ?, ?) "
            + "ON CONFLICT (timer_key) DO UPDATE SET due_ns = excluded.due_ns, payload = excluded.payload";
    private static final String CANCEL_TIMER = "DELETE FROM timers WHERE timer_key = ?";

    private final HeadCache headCache;
    private final StatementCache statements;
    /** Journal rows and ledger entries go as multi-row statements (SQLite; see {@link RowInserts}). */
    private final boolean multiRow;
    private final PendingInputs pendingInputs = new PendingInputs();
    private final List<LedgerEntry> pendingLedger = new ArrayList<>();
    private Heads heads;
    private boolean ledgerHeadDirty;

    public JdbiTx(Handle handle, String location, HeadCache headCache, StatementCache statements, boolean multiRow) {
        super(handle, location);
        this.headCache = headCache;
        this.statements = statements;
        this.multiRow = multiRow;
    }

    /** The tails after this transaction's appends; null when it appended nothing. */
    public Heads heads() {
        return heads;
    }

    @Override
    protected void beforeRead() {
        requireOpen();
        flush();
    }

    /** Sends the batched appends and moves the ledger_head row. */
    public void flush() {
        if (!pendingInputs.isEmpty()) {
            // the hot path of ingest: plain JDBC on the transaction's connection, no per-argument mapping
            try {
                EventHours.record(statements, handle.getConnection(), pendingInputs);
                pendingInputs.insert(statements, handle.getConnection(), multiRow);
            } catch (java.sql.SQLException e) {
                throw new org.jdbi.v3.core.ConnectionException(e);
            }
            pendingInputs.clear();
        }
        if (!pendingLedger.isEmpty() || ledgerHeadDirty) {
            // plain JDBC on statements kept prepared: the ledger's share of every commit
            try {
                if (!pendingLedger.isEmpty()) {
                    LEDGER.insert(statements, handle.getConnection(), pendingLedger, pendingLedger.size(), multiRow);
                    pendingLedger.clear();
                }
                if (ledgerHeadDirty) {
                    java.sql.PreparedStatement ps = statements.prepare(handle.getConnection(), UPDATE_HEAD);
                    ps.setLong(1, heads.ledgerSeq());
                    ps.setString(2, heads.ledgerHash());
                    ps.executeUpdate();
                    ledgerHeadDirty = false;
                }
            } catch (java.sql.SQLException e) {
                throw new org.jdbi.v3.core.ConnectionException(e);
            }
        }
    }

    private static void bindLedger(java.sql.PreparedStatement ps, int first, LedgerEntry e) throws java.sql.SQLException {
        ps.setLong(first + 1, e.seq());
        ps.setLong(first + 2, Times.nanos(e.at(), "LedgerDraft.at"));
        ps.setString(first + 3, e.kind());
        text(ps, first + 4, e.cluster());
        text(ps, first + 5, e.playbook());
        text(ps, first + 6, e.run());
        ps.setString(first + 7, e.entry());
        ps.setString(first + 8, e.prevHash());
        ps.setString(first + 9, e.hash());
    }

    static void text(java.sql.PreparedStatement ps, int i, String value) throws java.sql.SQLException {
        if (value == null) ps.setNull(i, java.sql.Types.VARCHAR);
        else ps.setString(i, value);
    }

    private Heads claim() {
        if (heads == null) heads = headCache.claim(handle, statements);
        return heads;
    }

    @Override
    public long appendInput(InputRow row) {
        requireOpen();
        long seq = append(row, claim().inputSeq() + 1);
        heads = heads.withInputSeq(seq);
        return seq;
    }

    @Override
    public long appendInputs(List<InputRow> rows) {
        requireOpen();
        Objects.requireNonNull(rows, "rows");
        if (rows.isEmpty()) return lastInputSeq();
        long seq = claim().inputSeq();
        for (int i = 0, n = rows.size(); i < n; i++) seq = append(rows.get(i), seq + 1); // the heads move once, below
        heads = heads.withInputSeq(seq);
        return seq;
    }

    /** Adds {@code row} (seq 0, the store numbers it) to the rows to send as {@code seq}. */
    private long append(InputRow row, long seq) {
        pendingInputs.add(row, seq);
        if (pendingInputs.size() >= BATCH) flush();
        return seq;
    }

    @Override
    public LedgerEntry appendLedger(Instant at, String kind, Map<String, Object> fields) {
        return appendLedger(new LedgerDraft(at, kind, fields));
    }

    private LedgerEntry appendLedger(LedgerDraft draft) {
        requireOpen();
        Objects.requireNonNull(draft, "draft");
        Times.nanos(draft.at(), "LedgerDraft.at");
        Heads h = claim();
        LedgerEntry entry = LedgerChain.link(h.ledgerSeq() + 1, h.ledgerHash(), draft);
        pendingLedger.add(entry);
        heads = h.withLedger(entry.seq(), entry.hash());
        ledgerHeadDirty = true;
        if (pendingLedger.size() >= BATCH) flush();
        return entry;
    }

    @Override
    public List<LedgerEntry> appendLedger(List<LedgerDraft> drafts) {
        requireOpen();
        Objects.requireNonNull(drafts, "drafts");
        List<LedgerEntry> out = new ArrayList<>(drafts.size());
        for (LedgerDraft d : drafts) out.add(appendLedger(d));
        return List.copyOf(out);
    }

    @Override
    public List<LedgerEntry> appendLedgerLinkedAside(List<LedgerDraft> drafts, java.util.concurrent.Executor aside, Runnable meanwhile) {
        requireOpen();
        for (LedgerDraft d : drafts) Times.nanos(Objects.requireNonNull(d, "draft").at(), "LedgerDraft.at");
        Heads h = claim();
        var linking = java.util.concurrent.CompletableFuture.supplyAsync(() -> LedgerChain.linkAll(h.ledgerSeq(), h.ledgerHash(), drafts), aside);
        meanwhile.run();
        flush(); // what meanwhile wrote goes to the database while the chain is hashed
        if (heads.ledgerSeq() != h.ledgerSeq()) throw new IllegalStateException("the ledger was appended to while a chain was linked aside");
        List<LedgerEntry> linked = dev.tend.shared.Futures.joined(linking);
        if (linked.isEmpty()) return List.of();
        LedgerEntry last = linked.get(linked.size() - 1);
        pendingLedger.addAll(linked);
        heads = heads.withLedger(last.seq(), last.hash());
        ledgerHeadDirty = true;
        return java.util.Collections.unmodifiableList(linked);
    }

    @Override
    public void upsertRun(RunRow r) {
        requireOpen();
        Objects.requireNonNull(r, "run");
        handle.createUpdate("INSERT INTO runs (" + Rows.RUN_COLUMNS + ") VALUES (:run_id, :playbook, :playbook_version, :cluster, "
                        + ":node, :state, :shadow, :created_ns, :started_ns, :ended_ns, :outcome, :current_step, :detail) "
                        + "ON CONFLICT (run_id) DO UPDATE SET playbook = excluded.playbook, playbook_version = excluded.playbook_version, "
                        + "cluster = excluded.cluster, node = excluded.node, state = excluded.state, shadow = excluded.shadow, "
                        + "created_ns = excluded.created_ns, started_ns = excluded.started_ns, ended_ns = excluded.ended_ns, "
                        + "outcome = excluded.outcome, current_step = excluded.current_step, detail = excluded.detail")
                .bind("run_id", r.runId())
                .bind("playbook", r.playbook())
                .bind("playbook_version", r.playbookVersion())
                .bind("cluster", r.cluster())
                .bind("node", r.node())
                .bind("state", r.state().wireName())
                .bind("shadow", r.shadow())
                .bind("created_ns", Times.toNanos(r.createdAt(), "RunRow.createdAt"))
                .bind("started_ns", Times.toNanos(r.startedAt(), "RunRow.startedAt"))
                .bind("ended_ns", Times.toNanos(r.endedAt(), "RunRow.endedAt"))
                .bind("outcome", r.outcome())
                .bind("current_step", r.currentStep())
                .bind("detail", r.detail())
                .execute();
    }

    @Override
    public void upsertStep(StepRow s) {
        requireOpen();
        Objects.requireNonNull(s, "step");
        handle.createUpdate("INSERT INTO steps (" + Rows.STEP_COLUMNS + ") VALUES (:run_id, :step_id, :ordinal, :state, :attempt, "
                        + ":started_ns, :ended_ns, :outcome, :detail) "
                        + "ON CONFLICT (run_id, step_id) DO UPDATE SET ordinal = excluded.ordinal, state = excluded.state, "
                        + "attempt = excluded.attempt, started_ns = excluded.started_ns, ended_ns = excluded.ended_ns, "
                        + "outcome = excluded.outcome, detail = excluded.detail")
                .bind("run_id", s.runId())
                .bind("step_id", s.stepId())
                .bind("ordinal", s.ordinal())
                .bind("state", s.state().wireName())
                .bind("attempt", s.attempt())
                .bind("started_ns", Times.toNanos(s.startedAt(), "StepRow.startedAt"))
                .bind("ended_ns", Times.toNanos(s.endedAt(), "StepRow.endedAt"))
                .bind("outcome", s.outcome())
                .bind("detail", s.detail())
                .execute();
    }

    @Override
    public void armTimer(TimerRow t) {
        requireOpen();
        Objects.requireNonNull(t, "timer");
        long due = Times.nanos(t.due(), "TimerRow.due");
        // a held candidate arms one and drops one: tens of thousands a day on the driver, on a statement kept prepared
        try {
            java.sql.PreparedStatement ps = statements.prepare(handle.getConnection(), ARM_TIMER);
            ps.setString(1, t.key());
            ps.setLong(2, due);
            text(ps, 3, t.payload());
            ps.executeUpdate();
        } catch (java.sql.SQLException e) {
            throw new org.jdbi.v3.core.ConnectionException(e);
        }
    }

    @Override
    public boolean cancelTimer(String key) {
        requireOpen();
        Objects.requireNonNull(key, "key");
        try {
            java.sql.PreparedStatement ps = statements.prepare(handle.getConnection(), CANCEL_TIMER);
            ps.setString(1, key);
            return ps.executeUpdate() > 0;
        } catch (java.sql.SQLException e) {
            throw new org.jdbi.v3.core.ConnectionException(e);
        }
    }

    @Override
    public void upsertExclusion(ExclusionRow x) {
        requireOpen();
        Objects.requireNonNull(x, "exclusion");
        handle.createUpdate("INSERT INTO exclusions (" + Rows.EXCLUSION_COLUMNS + ") VALUES (:cluster, :node, :reason, :owner, "
                        + ":created_ns, :until_ns) ON CONFLICT (cluster, node) DO UPDATE SET reason = excluded.reason, "
                        + "owner = excluded.owner, created_ns = excluded.created_ns, until_ns = excluded.until_ns")
                .bind("cluster", x.cluster())
                .bind("node", x.node() == null ? Rows.WHOLE_CLUSTER : x.node())
                .bind("reason", x.reason())
                .bind("owner", x.owner())
                .bind("created_ns", Times.toNanos(x.createdAt(), "ExclusionRow.createdAt"))
                .bind("until_ns", Times.toNanos(x.until(), "ExclusionRow.until"))
                .execute();
    }

    @Override
    public boolean removeExclusion(String cluster, String node) {
        requireOpen();
        Objects.requireNonNull(cluster, "cluster");
        return handle.createUpdate("DELETE FROM exclusions WHERE cluster = :cluster AND node = :node")
                .bind("cluster", cluster)
                .bind("node", node == null ? Rows.WHOLE_CLUSTER : node)
                .execute() > 0;
    }

    @Override
    public void upsertApproval(ApprovalRow a) {
        requireOpen();
        Objects.requireNonNull(a, "approval");
        handle.createUpdate("INSERT INTO approvals (" + Rows.APPROVAL_COLUMNS + ") VALUES (:run_id, :playbook, :cluster, :node, "
                        + ":requested_by, :requested_ns, :expires_ns, :state, :decided_by, :decided_ns, :reasons) "
                        + "ON CONFLICT (run_id) DO UPDATE SET playbook = excluded.playbook, cluster = excluded.cluster, "
                        + "node = excluded.node, requested_by = excluded.requested_by, requested_ns = excluded.requested_ns, "
                        + "expires_ns = excluded.expires_ns, state = excluded.state, decided_by = excluded.decided_by, "
                        + "decided_ns = excluded.decided_ns, reasons = excluded.reasons")
                .bind("run_id", a.runId())
                .bind("playbook", a.playbook())
                .bind("cluster", a.cluster())
                .bind("node", a.node())
                .bind("requested_by", a.requestedBy())
                .bind("requested_ns", Times.toNanos(a.requestedAt(), "ApprovalRow.requestedAt"))
                .bind("expires_ns", Times.toNanos(a.expiresAt(), "ApprovalRow.expiresAt"))
                .bind("state", a.state().wireName())
                .bind("decided_by", a.decidedBy())
                .bind("decided_ns", Times.toNanos(a.decidedAt(), "ApprovalRow.decidedAt"))
                .bind("reasons", a.reasons())
                .execute();
    }

    @Override
    public void putState(String key, String json) {
        requireOpen();
        Objects.requireNonNull(key, "key");
        Objects.requireNonNull(json, "json");
        handle.createUpdate("INSERT INTO fleet_state (state_key, json) VALUES (:key, :json) "
                        + "ON CONFLICT (state_key) DO UPDATE SET json = excluded.json")
                .bind("key", key)
                .bind("json", json)
                .execute();
    }

    @Override
    public boolean deleteState(String key) {
        requireOpen();
        Objects.requireNonNull(key, "key");
        return handle.createUpdate("DELETE FROM fleet_state WHERE state_key = :key").bind("key", key).execute() > 0;
    }

    @Override
    public void putSnapshot(dev.tend.store.SnapshotRow snap, int keep) {
        requireOpen();
        Objects.requireNonNull(snap, "snapshot");
        if (keep < 1) throw new IllegalArgumentException("keep must be at least 1, got " + keep);
        flush();
        SnapshotWrites.put(handle, snap, keep);
    }

    @Override
    public void putStreamOffset(String topic, int partition, long nextOffset) {
        requireOpen();
        Objects.requireNonNull(topic, "topic");
        if (partition < 0) throw new IllegalArgumentException("partition must be 0 or more, got " + partition);
        if (nextOffset < 0) throw new IllegalArgumentException("nextOffset must be 0 or more, got " + nextOffset);
        handle.createUpdate("INSERT INTO stream_offsets (topic, part, next_offset) VALUES (:topic, :part, :next) "
                        + "ON CONFLICT (topic, part) DO UPDATE SET next_offset = excluded.next_offset")
                .bind("topic", topic).bind("part", partition).bind("next", nextOffset).execute();
    }

    @Override
    public void enqueuePage(PageRow p) {
        requireOpen();
        PageWrites.enqueue(handle, statements, p);
    }

    @Override
    public long deleteInputs(long throughSeq, Instant before) {
        requireOpen();
        Objects.requireNonNull(before, "before");
        flush();
        return handle.createUpdate("DELETE FROM input_journal WHERE seq <= :through AND now_ns < :before "
                        + "AND seq < (SELECT MAX(seq) FROM input_journal)")
                .bind("through", throughSeq)
                .bind("before", Times.toNanos(before, "before"))
                .execute();
    }

    @Override
    public void addToOpenReceipts(List<dev.tend.store.OpenReceipt> receipts) {
        requireOpen();
        OpenReceipts.add(statements, handle.getConnection(), List.copyOf(receipts));
    }

    @Override
    public List<dev.tend.store.OpenReceipt> takeOpenReceipts() {
        requireOpen();
        return OpenReceipts.take(statements, handle.getConnection());
    }

    @Override
    public void updatePage(PageRow p) {
        requireOpen();
        PageWrites.update(handle, statements, p);
    }
}
