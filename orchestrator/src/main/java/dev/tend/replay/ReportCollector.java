package dev.tend.replay;

import dev.tend.engine.BrakeState;
import dev.tend.engine.Effect;
import dev.tend.engine.LedgerKind;
import dev.tend.engine.RunSnapshot;
import dev.tend.shared.RunState;
import dev.tend.engine.StepSnapshot;
import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;
import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.wire.Rfc3339;
import dev.tend.simulator.report.DecisionEntry;
import dev.tend.simulator.report.HealthPoint;
import dev.tend.simulator.report.NotificationEntry;
import dev.tend.simulator.report.RunEntry;
import dev.tend.simulator.report.StepEntry;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Turns what the engine does during a replay into report entries: every verdict it ledgers
 * (a decision), approval requests, brake changes, notifications, the most runs active at
 * once, and the unhealthy-cluster count minute by minute (reported at a coarser interval
 * for long recordings, {@link #healthInterval}).
 */
final class ReportCollector {
    /** Reports keep at most this many points of the unhealthy-cluster count. */
    static final int MAX_HEALTH_POINTS = 720;
    private static final long[] INTERVALS_MINUTES = {1, 2, 5, 10, 15, 30, 60, 120, 180, 360, 720, 1440};

    /**
     * The ledger entries {@link #observe} reads: a replay's engine makes no others (a replay keeps
     * no ledger, and an entry of a transition, a step or a dropped candidate is built for nothing).
     */
    static final java.util.Set<LedgerKind> LEDGER_READ = java.util.Set.of(LedgerKind.VERDICT, LedgerKind.APPROVAL_REQUESTED);

    private final List<DecisionEntry> decisions = new ArrayList<>();
    private final List<BrakePeriod> brakePeriods = new ArrayList<>();
    private final List<NotificationEntry> notifications = new ArrayList<>();
    private final Map<String, Id> ids = new HashMap<>();
    private static final Map<String, ReasonCode> CODES = codes();
    private static final Map<String, Verdict> VERDICTS = verdicts();
    private long approvalsRequested;
    private int maxConcurrent;
    private BrakeState engaged;
    private Instant start;
    /**
     * Minutes in which inputs came, from the start: the most clusters unhealthy during that
     * minute (the count carried into it included) and the count the minute's last input left.
     * Sparse, so that a recording with years between two events costs nothing.
     */
    private final java.util.TreeMap<Long, int[]> minutes = new java.util.TreeMap<>();
    private int lastCount;
    private Instant lastNow;
    private long lastMinute = -1;
    private int[] lastSeen;

    void start(Instant at) {
        start = at;
    }

    /** Where virtual time started, or null before it did. */
    Instant startTime() {
        return start;
    }

    /** Takes the effects of one input handled at {@code now}. */
    void observe(List<Effect> effects, Instant now) {
        for (int i = 0; i < effects.size(); i++) {
            Effect e = effects.get(i);
            if (e instanceof Effect.Ledger l) {
                if (l.type() == LedgerKind.VERDICT) decisions.add(decision(l.fields(), now));
                else if (l.type() == LedgerKind.APPROVAL_REQUESTED) approvalsRequested++;
            } else if (e instanceof Effect.BrakeChanged b) {
                brake(b.brake(), now);
            } else if (e instanceof Effect.Notify n) {
                notifications.add(new NotificationEntry(now, n.channel(), n.message()));
            }
        }
    }

    /** After each input: how many runs are active and clusters unhealthy. */
    void afterInput(Instant now, int activeRuns, int unhealthyClusters) {
        if (activeRuns > maxConcurrent) maxConcurrent = activeRuns;
        // most inputs fall in the minute of the one before: that minute's counts without a map lookup
        int[] seen;
        if (now == lastNow || now.equals(lastNow)) {
            seen = lastSeen;
        } else {
            long m = minute(now);
            seen = m == lastMinute ? lastSeen : minutes.computeIfAbsent(m, k -> new int[]{lastCount, lastCount});
            lastNow = now;
            lastMinute = m;
            lastSeen = seen;
        }
        if (unhealthyClusters > seen[0]) seen[0] = unhealthyClusters;
        seen[1] = unhealthyClusters;
        lastCount = unhealthyClusters;
    }

    private void brake(BrakeState b, Instant now) {
        if (b.engaged()) {
            if (engaged == null) engaged = b;
        } else if (engaged != null) {
            brakePeriods.add(new BrakePeriod(engaged.since(), by(engaged), engaged.reason(), now, null, null));
            engaged = null;
        }
    }

    private DecisionEntry decision(Map<String, Object> f, Instant now) {
        List<ReasonCode> reasons = new ArrayList<>();
        if (f.get("reasons") instanceof List<?> codes) {
            for (Object c : codes) {
                ReasonCode code = CODES.get(c);
                reasons.add(code != null ? code : ReasonCode.parse((String) c));
            }
        }
        Object until = f.get("hold_until");
        return new DecisionEntry(now, id(f.get("playbook")), id(f.get("cluster")), id(f.get("node")),
                verdict((String) f.get("verdict")), reasons, id(f.get("signal")),
                until == null ? null : Rfc3339.parse((String) until));
    }

    private static Verdict verdict(String wire) {
        Verdict v = VERDICTS.get(wire);
        return v != null ? v : Verdict.parse(wire);
    }

    private static Map<String, Verdict> verdicts() {
        Map<String, Verdict> m = new HashMap<>();
        for (Verdict v : Verdict.values()) m.put(v.wireName(), v);
        return Map.copyOf(m);
    }

    private static Map<String, ReasonCode> codes() {
        Map<String, ReasonCode> m = new HashMap<>();
        for (ReasonCode c : ReasonCode.values()) m.put(c.code(), c);
        return Map.copyOf(m);
    }

    /** Ledger fields hold ids as strings; the few distinct ones are made into ids once. */
    private Id id(Object value) {
        if (value == null) return null;
        return ids.computeIfAbsent((String) value, Id::of);
    }

    private long minute(Instant now) {
        return Math.max(0, Duration.between(start, now).toMinutes());
    }


    List<DecisionEntry> decisions() {
        return decisions;
    }

    long approvalsRequested() {
        return approvalsRequested;
    }

    int maxConcurrent() {
        return maxConcurrent;
    }

    /** The brake periods; one still engaged at {@code horizon} is reported without a release. */
    List<BrakePeriod> brakePeriods() {
        List<BrakePeriod> out = new ArrayList<>(brakePeriods);
        if (engaged != null) out.add(new BrakePeriod(engaged.since(), by(engaged), engaged.reason(), null, null, null));
        return out;
    }

    List<NotificationEntry> notifications() {
        return notifications;
    }

    /** The interval of the unhealthy-cluster points for a replay ending at {@code horizon}. */
    Duration healthInterval(Instant horizon) {
        long minutes = start == null ? 1 : Math.max(1, Duration.between(start, horizon).toMinutes() + 1);
        for (long i : INTERVALS_MINUTES) {
            if ((minutes + i - 1) / i <= MAX_HEALTH_POINTS) return Duration.ofMinutes(i);
        }
        return Duration.ofMinutes((minutes + MAX_HEALTH_POINTS - 1) / MAX_HEALTH_POINTS);
    }

    /** The most clusters unhealthy at once per interval, from the start to {@code horizon}. */
    List<HealthPoint> unhealthy(Instant horizon) {
        if (start == null) return List.of();
        long last = minute(horizon);
        long step = healthInterval(horizon).toMinutes();
        List<HealthPoint> out = new ArrayList<>();
        for (long m = 0; m <= last; m += step) {
            // minutes without an input hold the count the last input before them left
            Map.Entry<Long, int[]> before = minutes.lowerEntry(m);
            int max = before == null ? 0 : before.getValue()[1];
            for (int[] seen : minutes.subMap(m, true, Math.min(m + step, last + 1L), false).values()) max = Math.max(max, seen[0]);
            out.add(new HealthPoint(start.plus(Duration.ofMinutes(m)), max));
        }
        return out;
    }

    /** Runs that began executing (or were decided in shadow mode), in run-id order. */
    static List<RunEntry> runs(Collection<RunSnapshot> snapshots) {
        List<RunEntry> out = new ArrayList<>();
        for (RunSnapshot r : snapshots) {
            boolean shadowed = r.state() == RunState.SHADOWED;
            if (r.startedAt() == null && !shadowed) continue;
            List<StepEntry> steps = new ArrayList<>();
            for (StepSnapshot s : r.steps()) {
                steps.add(new StepEntry(s.stepId(), s.kind(), s.state().wireName(), s.attempt(), s.startedAt(), s.endedAt(), s.outcome()));
            }
            out.add(new RunEntry(r.runId(), Id.of(r.playbook()), r.target().cluster(), r.target().node(),
                    r.startedAt() != null ? r.startedAt() : r.createdAt(), r.endedAt(), r.state().wireName(), r.outcome(), steps));
        }
        out.sort((a, b) -> a.run().compareTo(b.run()));
        return out;
    }

    /** Who engaged the brake: the engine names an operator or {@code automatic}; "unknown" if it named no one. */
    private static String by(BrakeState b) {
        return b.by() == null ? "unknown" : b.by();
    }
}
