package dev.tend.runtime;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.ApprovalSnapshot;
import dev.tend.engine.BrakeState;
import dev.tend.engine.Effect;
import dev.tend.engine.Exclusion;
import dev.tend.engine.LedgerKind;
import dev.tend.engine.RunSnapshot;
import dev.tend.engine.StepSnapshot;
import dev.tend.shared.TendException;
import dev.tend.store.ApprovalRow;
import dev.tend.store.ExclusionRow;
import dev.tend.store.LedgerDraft;
import dev.tend.store.PageRow;
import dev.tend.store.RunRow;
import dev.tend.store.StepRow;
import dev.tend.store.StoreTx;
import dev.tend.store.TimerRow;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Writes the durable part of an input's effects inside the transaction that journals the
 * input: ledger entries (notifications included, as {@code notification} entries, each also put
 * in the page outbox), the run,
 * step, approval, exclusion and brake projections, and the timers table.
 */
final class Projections {
    private static final ObjectMapper JSON = new ObjectMapper();

    private Projections() {
    }

    /**
     * What an input's effects write that needs no transaction, made ahead: their ledger
     * drafts (notifications included) and the pages they put in the outbox, each in the order
     * of the effects. The driver prepares a batch while the batch before is written, so that
     * the committing thread, which every commit waits for, only writes; see {@link #renderFor}
     * for where the drafts' texts are rendered.
     */
    record Prepared(List<LedgerDraft> ledger, List<PageRow> pages) {
        /**
         * Renders the drafts of a decided batch on the calling thread (the driver's) when its
         * commit will hash their chain itself: a batch of fewer than {@link CommitWriter#LINK_ASIDE_FROM}
         * drafts, or one that answers callers (its receipts join the chain). A bigger batch's
         * chain is hashed on a thread beside its commit, which renders each text as it hashes
         * it: rendering them on the driver was about a tenth of its time in a 1,000,000-line
         * ingest, while that thread waited for work (DEVELOPERS.md, "Ingest").
         */
        static void renderFor(List<Prepared> batch, boolean answersCallers) {
            int drafts = 0;
            for (Prepared p : batch) drafts += p.ledger().size();
            if (drafts >= CommitWriter.LINK_ASIDE_FROM && !answersCallers) return;
            for (Prepared p : batch) for (LedgerDraft d : p.ledger()) d.render();
        }

        /** What an input without effects writes: nothing (most transitions of a file decide nothing). */
        private static final Prepared NOTHING = new Prepared(List.of(), List.of());

        static Prepared of(Instant at, List<Effect> effects) {
            // under C1, which ingest runs with, every list and iterator made here is allocated: none for no effects
            if (effects.isEmpty()) return NOTHING;
            List<LedgerDraft> ledger = new ArrayList<>(2);
            List<PageRow> pages = List.of();
            for (Effect e : effects) {
                if (e instanceof Effect.Ledger l) {
                    ledger.add(new LedgerDraft(at, l.kind(), l.fields()));
                } else if (e instanceof Effect.Notify n) {
                    Map<String, Object> f = new LinkedHashMap<>(n.fields());
                    f.put("id", n.id());
                    f.put("page_kind", n.kind());
                    f.put("channel", n.channel());
                    f.put("message", n.message());
                    ledger.add(new LedgerDraft(at, LedgerKind.NOTIFICATION.wire(), LedgerKind.NOTIFICATION.check(f)));
                    Map<String, Object> payload = new LinkedHashMap<>();
                    payload.put("id", n.id());
                    payload.put("channel", n.channel());
                    payload.put("at", dev.tend.engine.Effects.normalise(at));
                    payload.put("kind", n.kind());
                    payload.put("message", n.message());
                    n.fields().forEach(payload::putIfAbsent);
                    if (pages.isEmpty()) pages = new ArrayList<>(1);
                    pages.add(PageRow.pending(n.id(), n.channel(), at, json(payload)));
                }
            }
            return new Prepared(ledger, pages);
        }
    }

    /** {@link #apply(StoreTx, Instant, List, Prepared, List, Set)} with what it writes prepared here, every timer operation written. */
    static void apply(StoreTx tx, Instant at, List<Effect> effects, List<LedgerDraft> ledger) {
        apply(tx, at, effects, Prepared.of(at, effects), ledger, Set.of());
    }

    /**
     * Writes {@code effects} (prepared as {@code prepared}), adding their ledger drafts to
     * {@code ledger}; of the timer operations, none in {@code replaced} (see {@link TimerOps}).
     */
    static void apply(StoreTx tx, Instant at, List<Effect> effects, Prepared prepared, List<LedgerDraft> ledger, Set<Effect> replaced) {
        if (effects.isEmpty()) return;
        int drafts = 0;
        int pages = 0;
        for (Effect e : effects) {
            if (e instanceof Effect.Ledger) {
                ledger.add(prepared.ledger().get(drafts++));
            } else if (e instanceof Effect.Notify) {
                ledger.add(prepared.ledger().get(drafts++));
                // the page enters the outbox with its ledger entry: delivered at least once, even after a crash
                tx.enqueuePage(prepared.pages().get(pages++));
            } else if (e instanceof Effect.RunChanged r) {
                run(tx, r.run());
            } else if (e instanceof Effect.ApprovalChanged a) {
                approval(tx, a.approval());
            } else if (e instanceof Effect.ExclusionsChanged x) {
                if (x.exclusionOrNull() == null) {
                    tx.removeExclusion(x.target().cluster().value(), x.target().node() == null ? null : x.target().node().value());
                } else {
                    Exclusion ex = x.exclusionOrNull();
                    tx.upsertExclusion(new ExclusionRow(ex.target().cluster().value(),
                            ex.target().node() == null ? null : ex.target().node().value(), ex.reason(), ex.owner(),
                            ex.createdAt(), ex.until()));
                }
            } else if (e instanceof Effect.BrakeChanged b) {
                tx.putState("brake", json(brake(b.brake())));
            } else if (e instanceof Effect.ArmTimer t) {
                if (!replaced.contains(e)) tx.armTimer(new TimerRow(t.key(), t.due(), "{}"));
            } else if (e instanceof Effect.CancelTimer t) {
                if (!replaced.contains(e)) tx.cancelTimer(t.key());
            }
        }
    }

    private static void run(StoreTx tx, RunSnapshot r) {
        tx.upsertRun(new RunRow(r.runId(), r.playbook(), r.playbookVersion(), r.target().cluster().value(),
                r.target().node() == null ? null : r.target().node().value(), r.state(), r.shadow(),
                r.createdAt(), r.startedAt(), r.endedAt(), r.outcome(), r.currentStep(), "{}"));
        for (StepSnapshot s : r.steps()) {
            tx.upsertStep(new StepRow(r.runId(), s.stepId(), s.ordinal(), s.state(), s.attempt(), s.startedAt(),
                    s.endedAt(), s.outcome(), json(Map.of("kind", s.kind()))));
        }
    }

    private static void approval(StoreTx tx, ApprovalSnapshot a) {
        tx.upsertApproval(new ApprovalRow(a.runId(), a.playbook(), a.target().cluster().value(),
                a.target().node() == null ? null : a.target().node().value(), a.requestedBy(), a.requestedAt(),
                a.expiresAt(), a.state(), a.decidedBy(), a.decidedAt(), json(a.reasons())));
    }

    static Map<String, Object> brake(BrakeState b) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("engaged", b.engaged());
        m.put("since", b.since() == null ? null : b.since().toString());
        m.put("by", b.by());
        m.put("reason", b.reason());
        m.put("manual", b.manual());
        return m;
    }

    static String json(Object o) {
        try {
            return JSON.writeValueAsString(o);
        } catch (JsonProcessingException e) {
            throw new TendException("cannot write a projection: " + e.getMessage(), e);
        }
    }
}
