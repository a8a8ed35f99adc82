package dev.tend.engine;

import dev.tend.engine.guard.Decision;
import dev.tend.engine.run.RunMemo;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;
import dev.tend.shared.fleet.HealthMemo;

import java.time.Instant;
import java.util.List;
import java.util.Objects;

/**
 * Everything an {@link Engine} knows, as plain values: what a snapshot holds. An engine
 * rebuilt from it by {@link Engine#restore} (with the same {@link EngineSetup}) is
 * indistinguishable from the engine it was taken from: the same next inputs give the same
 * effects. Playbooks are named by id and version, never copied: the setup supplies them.
 * Lists keep the order the engine iterates in; nothing here is shared with the engine.
 *
 * @param now          the latest processing time seen
 * @param eventTime    the latest event time reached
 * @param inputs       inputs handled so far
 * @param runSeq       the number of the last run created
 * @param timers       armed timers, by key
 * @param runs         every run, in creation order
 * @param activeRuns   ids of the runs holding their target, in the order they started
 * @param candidates   held, denied or waiting candidates, by key
 * @param eventAgenda  candidates waiting for event time to reach an instant, soonest first
 * @param timeAgenda   candidates held until a processing-time instant (a rate permit, a cooldown's end), soonest first
 * @param starts       when each playbook last started on each target (cooldown and loop history)
 * @param loopStopped  playbook and target pairs stopped as loops until a person clears them
 * @param flapPaged    candidates already paged for flapping in their current episode
 * @param exclusions   exclusions, in the order made
 * @param brake        the fleet brake
 * @param budgets      start budgets (rate limits)
 * @param approvals    approval requests and answers, in the engine's order
 * @param health       the fleet health view and topology
 */
public record EngineState(Instant now, Instant eventTime, long inputs, long runSeq, List<Timer> timers, List<RunMemo> runs,
                          List<String> activeRuns, List<CandidateMemo> candidates, List<AgendaSlot> eventAgenda,
                          List<AgendaSlot> timeAgenda,
                          List<Starts> starts, List<Candidate.Key> loopStopped, List<Candidate.Key> flapPaged,
                          List<Exclusion> exclusions, BrakeMemo brake, List<Budget> budgets, List<ApprovalSnapshot> approvals,
                          HealthMemo health) {
    public EngineState {
        Objects.requireNonNull(now, "now");
        Objects.requireNonNull(eventTime, "eventTime");
        timers = List.copyOf(timers);
        runs = List.copyOf(runs);
        activeRuns = List.copyOf(activeRuns);
        candidates = List.copyOf(candidates);
        eventAgenda = List.copyOf(eventAgenda);
        timeAgenda = List.copyOf(timeAgenda);
        starts = List.copyOf(starts);
        loopStopped = List.copyOf(loopStopped);
        flapPaged = List.copyOf(flapPaged);
        exclusions = List.copyOf(exclusions);
        Objects.requireNonNull(brake, "brake");
        budgets = List.copyOf(budgets);
        approvals = List.copyOf(approvals);
        Objects.requireNonNull(health, "health");
    }

    public record Timer(String key, Instant due) {
    }

    /** A candidate: its playbook by id, the rest as in {@link Candidate}; decision null before the first verdict. */
    public record CandidateMemo(String playbook, Target target, SignalKey trigger, Instant problemSince, Instant firstSeen,
                                String runId, boolean approved, Instant liftedAt, Decision decision) {
    }

    public record AgendaSlot(Instant at, List<String> candidates) {
        public AgendaSlot {
            candidates = List.copyOf(candidates);
        }
    }

    public record Starts(Candidate.Key key, List<Instant> at) {
        public Starts {
            at = List.copyOf(at);
        }
    }

    /**
     * The fleet brake's state and its memory: re-armed after a manual release, episodes
     * paged, settling; and the episode's page while it gathers the event's size (pending,
     * the peak count and fraction, pages folded into it, whether this episode pages at all).
     */
    public record BrakeMemo(BrakeState state, boolean armed, int episodes, boolean settling, boolean pagePending,
                            int peakUnhealthy, double peakFraction, int folded, boolean autoPaged) {
    }

    /**
     * One start budget, a rolling window: its name and rate ({@code count} per {@code period})
     * and its most recent starts (at most {@code count}), oldest first.
     */
    public record Budget(String name, int count, java.time.Duration period, List<Instant> starts) {
        public Budget {
            starts = List.copyOf(starts);
        }
    }
}
