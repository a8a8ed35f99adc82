package dev.tend.handover;

import dev.tend.shared.RunState;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.LedgerKind;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.store.LedgerEntry;
import dev.tend.store.LedgerPeriodQuery;
import dev.tend.store.LedgerVerification;

import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/**
 * Folds ledger entries, taken in seq order from the beginning of the ledger up to the end of
 * a period, into a {@link HandoverReport}. Entries before the period only carry state
 * forward (what was running, pending or engaged); only entries in the period are counted.
 * Not thread-safe; one per report.
 */
final class LedgerTally {
    private static final ObjectMapper JSON = new ObjectMapper();

    private final ReportPeriod period;
    private final Map<String, RunState> runs = new LinkedHashMap<>();
    private final Map<String, ApprovalState> approvals = new LinkedHashMap<>();
    private final Map<String, PlaybookState> playbooks = new TreeMap<>();
    private final Map<String, Candidates> reasons = new HashMap<>();
    private final List<BrakePeriod> brakes = new ArrayList<>();
    private final Map<String, LoopStop> loops = new LinkedHashMap<>();
    private BrakePeriod openBrake;
    private long inPeriod;
    private final List<PageLine> pages = new ArrayList<>();
    private long unreadable;

    LedgerTally(ReportPeriod period) {
        this.period = period;
    }

    void accept(LedgerEntry e) {
        if (!e.at().isBefore(period.until())) return;
        JsonNode f;
        try {
            f = JSON.readTree(e.entry());
        } catch (JsonProcessingException bad) {
            f = null;
        }
        accept(e.seq(), e.at(), e.kind(), f != null && f.isObject() ? f : null);
    }

    /** Folds in an entry whose text was parsed already: {@code f} is null when the text is not a JSON object. */
    void accept(long seq, Instant at, String kindColumn, JsonNode f) {
        boolean counted = period.contains(at);
        if (!at.isBefore(period.until())) return;
        if (counted) inPeriod++;
        if (f == null) {
            if (counted) unreadable++;
            return;
        }
        LedgerKind kind = kindColumn == null ? null : LedgerKind.of(kindColumn).orElse(null);
        if (kind == null) return; // a kind this version does not write says nothing the report shows
        switch (kind) {
            case RUN_STARTED -> {
                RunState r = run(f, at);
                r.startedAt = at;
                r.state = RunLine.RUNNING;
                r.note = null;
                if (counted) playbook(r.playbook).started++;
            }
            case RUN_SHADOWED -> run(f, at);
            case RUN_PAUSED -> setState(f, RunLine.PAUSED, text(f, "reason"));
            case RUN_RESUMED -> setState(f, RunLine.RUNNING, null);
            case RUN_NEEDS_HUMAN -> setState(f, RunLine.NEEDS_HUMAN,
                    "step " + text(f, "step") + ": " + text(f, "reason"));
            case RUN_ENDED -> ended(f, at, counted);
            case APPROVAL_REQUESTED -> {
                RunState r = run(f, at);
                r.state = RunLine.AWAITING_APPROVAL;
                ApprovalState a = new ApprovalState(r, at, instant(f, "expires_at", at));
                approvals.put(r.run, a);
            }
            case APPROVAL_GRANTED -> settle(f, dev.tend.shared.ApprovalState.APPROVED.wireName(), at, RunLine.APPROVED);
            case APPROVAL_REJECTED -> settle(f, dev.tend.shared.ApprovalState.REJECTED.wireName(), at, null);
            case APPROVAL_LAPSED -> settle(f, dev.tend.shared.ApprovalState.LAPSED.wireName(), at, null);
            case EXECUTOR_CALL -> {
                RunState r = runs.get(text(f, "run"));
                if (r != null) r.calls.put(text(f, "step") + "/" + f.path("attempt").asText(), text(f, "action"));
            }
            case EXECUTOR_RESULT -> {
                RunState r = runs.get(text(f, "run"));
                if (r != null && f.path("success").asBoolean(false)) {
                    String action = r.calls.get(text(f, "step") + "/" + f.path("attempt").asText());
                    if (action != null) r.actions.add(action);
                }
            }
            case VERDICT -> {
                if (counted) verdict(f);
            }
            case LOOP_STOPPED -> {
                LoopStop l = new LoopStop(orUnknown(text(f, "playbook")), orUnknown(text(f, "cluster")), text(f, "node"), at);
                loops.putIfAbsent(l.playbook() + " " + l.target(), l);
            }
            case LOOP_CLEARED -> loops.remove(orUnknown(text(f, "playbook")) + " " + orUnknown(text(f, "cluster"))
                    + (text(f, "node") == null ? "" : "/" + text(f, "node")));
            case NOTIFICATION_DELIVERED -> {
                if (counted) pages.add(page(f, at, PageLine.DELIVERED));
            }
            case NOTIFICATION_FAILED -> {
                if (counted && f.path("final").asBoolean(false)) pages.add(page(f, at, PageLine.FAILED));
            }
            case BRAKE_ENGAGED -> engaged(f, at);
            case BRAKE_RELEASED -> released(f, at);
            default -> {
                // every other kind is counted above and says nothing the report shows
            }
        }
    }

    private static PageLine page(JsonNode f, Instant at, String outcome) {
        return new PageLine(at, orUnknown(text(f, "id")), orUnknown(text(f, "channel")), text(f, "page_kind"), outcome,
                f.path("attempt").asInt(1), text(f, "answer"));
    }

    private RunState run(JsonNode f, Instant at) {
        String id = orUnknown(text(f, "run"));
        RunState r = runs.get(id);
        if (r == null) {
            r = new RunState(id, orUnknown(text(f, "playbook")), orUnknown(text(f, "cluster")),
                    text(f, "node"), at);
            runs.put(r.run, r);
        }
        return r;
    }

    private void setState(JsonNode f, String state, String note) {
        RunState r = runs.get(text(f, "run"));
        if (r == null || r.endedAt != null) return;
        r.state = state;
        r.note = note;
    }

    private void ended(JsonNode f, Instant at, boolean counted) {
        RunState r = run(f, at);
        String state = text(f, "state");
        r.state = RunLine.isEnd(state) ? state : RunLine.CANCELLED;
        r.endedAt = at;
        r.note = text(f, "outcome");
        ApprovalState a = approvals.get(r.run);
        if (a != null && a.state.equals(dev.tend.shared.ApprovalState.PENDING.wireName())) {
            a.state = dev.tend.shared.ApprovalState.WITHDRAWN.wireName();
            a.decidedAt = at;
        }
        if (counted) {
            PlaybookState p = playbook(r.playbook);
            switch (r.state) {
                case RunLine.SUCCEEDED -> p.succeeded++;
                case RunLine.FAILED -> p.failed++;
                case RunLine.SHADOWED -> p.shadowed++;
                case RunLine.STOOD_DOWN -> p.stoodDown++;
                default -> p.cancelled++;
            }
        } else {
            // it ended before the period began: nothing of it belongs in the report
            runs.remove(r.run);
            approvals.remove(r.run);
        }
    }

    private void settle(JsonNode f, String state, Instant at, String runState) {
        ApprovalState a = approvals.get(text(f, "run"));
        if (a == null || !a.state.equals(dev.tend.shared.ApprovalState.PENDING.wireName())) return;
        a.state = state;
        a.decidedAt = at;
        a.decidedBy = text(f, "by");
        if (runState != null && a.run.endedAt == null) a.run.state = runState;
    }

    private void verdict(JsonNode f) {
        String verdict = text(f, "verdict");
        int slot = "hold".equals(verdict) ? 0 : "deny".equals(verdict) ? 1 : -1;
        if (slot < 0) return;
        String pb = orUnknown(text(f, "playbook"));
        // one key for the playbook's count and every reason's: no text is built per verdict
        Candidate c = new Candidate(pb, orUnknown(text(f, "cluster")), text(f, "node"));
        playbook(pb).add(slot == 0, c);
        for (JsonNode code : f.path("reasons")) {
            reasons.computeIfAbsent(code.asText(), k -> new Candidates()).add(slot == 0, c);
        }
    }

    private void engaged(JsonNode f, Instant at) {
        String by = orUnknown(text(f, "by"));
        String reason = text(f, "reason");
        if (openBrake == null) {
            openBrake = new BrakePeriod(at, by, reason, null, null, null);
        } else {
            // engaged again while engaged (an operator over the automatic brake): one period, both named
            String more = by + (reason == null ? "" : ": " + reason);
            openBrake = new BrakePeriod(openBrake.engagedAt(), openBrake.engagedBy(),
                    (openBrake.reason() == null ? "" : openBrake.reason() + "; ") + "engaged again by " + more, null, null, null);
        }
    }

    private void released(JsonNode f, Instant at) {
        BrakePeriod open = openBrake;
        if (open == null) {
            // the ledger holds no engagement (it was cut or edited): rebuild it from the release
            Instant since = instant(f, "engaged_since", at);
            open = new BrakePeriod(since.isAfter(at) ? at : since, "unknown", null, null, null, null);
        }
        openBrake = null;
        if (at.isBefore(period.since())) return;
        // a wall clock stepped back between two entries must not make a period end before it began
        Instant end = at.isBefore(open.engagedAt()) ? open.engagedAt() : at;
        brakes.add(new BrakePeriod(open.engagedAt(), open.engagedBy(), open.reason(), end, orUnknown(text(f, "by")),
                text(f, "reason")));
    }

    private PlaybookState playbook(String name) {
        return playbooks.computeIfAbsent(name, k -> new PlaybookState());
    }

    /** The kinds read from before a period (see {@link LedgerPeriodQuery}): what the tally carries into it. */
    static final Set<String> CARRIED = Set.of(LedgerKind.BRAKE_ENGAGED.wire(), LedgerKind.BRAKE_RELEASED.wire(),
            LedgerKind.LOOP_STOPPED.wire(), LedgerKind.LOOP_CLEARED.wire());
    /** Kinds that make a run known to the tally ({@link #run}); RUN_ENDED forgets a run that ended before the period. */
    static final Set<String> OPENING = Set.of(LedgerKind.RUN_STARTED.wire(), LedgerKind.RUN_SHADOWED.wire(),
            LedgerKind.APPROVAL_REQUESTED.wire());
    static final Set<String> CLOSING = Set.of(LedgerKind.RUN_ENDED.wire());

    /**
     * What a report of {@code period} must read: every entry of the period; before it, the brake
     * and loop entries and every entry of a run not ended when the period begins. Every other
     * entry before the period leaves the tally as it was (verdicts and pages count only in the
     * period; a run that ended before it is forgotten at its end), so the report is the one
     * the whole ledger gives.
     */
    static LedgerPeriodQuery query(ReportPeriod period) {
        return new LedgerPeriodQuery(period.since(), period.until(), CARRIED, OPENING, CLOSING);
    }

    HandoverReport toReport(LedgerVerification v, long ledgerEntries, long verifiedFrom) {
        Map<String, RunCounts> byPlaybook = new TreeMap<>();
        playbooks.forEach((name, p) -> byPlaybook.put(name, p.counts()));
        List<ReasonCount> byReason = new ArrayList<>();
        reasons.forEach((code, c) -> byReason.add(new ReasonCount(code, c.held.size(), c.denied.size())));
        byReason.sort(Comparator.comparingInt((ReasonCount r) -> guardOrder(r.code())).thenComparing(ReasonCount::code));
        List<RunLine> runLines = new ArrayList<>();
        for (RunState r : runs.values()) runLines.add(r.line());
        runLines.sort(Comparator.comparing(RunLine::createdAt).thenComparing(RunLine::run));
        List<ApprovalLine> approvalLines = new ArrayList<>();
        for (ApprovalState a : approvals.values()) approvalLines.add(a.line());
        approvalLines.sort(Comparator.comparing(ApprovalLine::requestedAt).thenComparing(ApprovalLine::run));
        List<BrakePeriod> brakeList = new ArrayList<>(brakes);
        if (openBrake != null) brakeList.add(openBrake);
        LedgerStatus status = new LedgerStatus(ledgerEntries, inPeriod, v.headHash(), v.ok(), v.firstBrokenSeq(), v.reason(),
                unreadable, verifiedFrom);
        return new HandoverReport(period, byPlaybook, byReason, runLines, approvalLines, brakeList, List.copyOf(loops.values()),
                status, pages);
    }

    private static int guardOrder(String code) {
        for (ReasonCode c : ReasonCode.values()) if (c.code().equals(code)) return c.ordinal();
        return Integer.MAX_VALUE;
    }

    private static String text(JsonNode f, String field) {
        JsonNode n = f.get(field);
        return n == null || n.isNull() ? null : n.asText();
    }

    private static String orUnknown(String s) {
        return s == null ? "?" : s;
    }

    private static Instant instant(JsonNode f, String field, Instant fallback) {
        String s = text(f, field);
        if (s == null) return fallback;
        try {
            return Instant.parse(s);
        } catch (DateTimeParseException e) {
            return fallback;
        }
    }

    private static final class RunState {
        final String run;
        final String playbook;
        final String cluster;
        final String node;
        final Instant createdAt;
        final Map<String, String> calls = new HashMap<>();
        final LinkedHashSet<String> actions = new LinkedHashSet<>();
        Instant startedAt;
        Instant endedAt;
        String state = RunLine.RUNNING;
        String note;

        RunState(String run, String playbook, String cluster, String node, Instant createdAt) {
            this.run = run;
            this.playbook = playbook;
            this.cluster = cluster;
            this.node = node;
            this.createdAt = createdAt;
        }

        RunLine line() {
            // entries carry processing time; a wall clock stepped back must not put an end before a beginning
            Instant started = startedAt == null || startedAt.isAfter(createdAt) ? startedAt : createdAt;
            Instant ended = endedAt == null || endedAt.isAfter(createdAt) ? endedAt : createdAt;
            return new RunLine(run, playbook, cluster, node, createdAt, started, ended, state, note, List.copyOf(actions));
        }
    }

    private static final class ApprovalState {
        final RunState run;
        final Instant requestedAt;
        final Instant expiresAt;
        String state = dev.tend.shared.ApprovalState.PENDING.wireName();
        String decidedBy;
        Instant decidedAt;

        ApprovalState(RunState run, Instant requestedAt, Instant expiresAt) {
            this.run = run;
            this.requestedAt = requestedAt;
            this.expiresAt = expiresAt.isBefore(requestedAt) ? requestedAt : expiresAt;
        }

        ApprovalLine line() {
            Instant decided = decidedAt == null || decidedAt.isAfter(requestedAt) ? decidedAt : requestedAt;
            return new ApprovalLine(run.run, run.playbook, run.cluster, run.node, requestedAt, expiresAt, state, decidedBy, decided);
        }
    }

    /** A candidate: a playbook on a target (a cluster, or a node of it). */
    private record Candidate(String playbook, String cluster, String node) {
    }

    /** Distinct candidates held and denied. */
    private static class Candidates {
        final Set<Candidate> held = new HashSet<>();
        final Set<Candidate> denied = new HashSet<>();

        void add(boolean hold, Candidate candidate) {
            (hold ? held : denied).add(candidate);
        }
    }

    private static final class PlaybookState extends Candidates {
        int started;
        int succeeded;
        int failed;
        int cancelled;
        int shadowed;
        int stoodDown;

        RunCounts counts() {
            return new RunCounts(started, succeeded, failed, cancelled, shadowed, held.size(), denied.size(), stoodDown);
        }
    }
}
