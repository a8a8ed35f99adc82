package dev.tend.engine;

import dev.tend.playbooks.Playbook;
import dev.tend.shared.Id;
import dev.tend.shared.SignalKey;
import dev.tend.shared.Target;

import java.time.Instant;
import java.util.Objects;

/**
 * A run that a playbook wants to start on a target because a problem opened.
 *
 * @param trigger      the signal whose transition matched the playbook
 * @param problemSince event time at which the trigger entered its problem state
 * @param firstSeen    processing time of the first verdict
 * @param runId        the run created for an approval request, or null before that
 * @param approved     a person approved it; the approval guard lets it through
 * @param liftedAt     event time at which the last mask or exclusion on it lifted, or null:
 *                     {@code confirm-for} counts from the later of this and {@code problemSince}
 */
public record Candidate(Playbook playbook, Target target, SignalKey trigger, Instant problemSince,
                        Instant firstSeen, String runId, boolean approved, Instant liftedAt) {
    public Candidate {
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(target, "target");
        Objects.requireNonNull(trigger, "trigger");
        Objects.requireNonNull(problemSince, "problemSince");
    }

    /** Identifies a candidate: at most one per playbook and target. */
    public record Key(Id playbook, Target target) {
        // written out rather than generated: keys are looked up on every evaluation
        @Override
        public boolean equals(Object o) {
            if (this == o) return true;
            return o instanceof Key k && playbook.equals(k.playbook) && target.equals(k.target);
        }

        @Override
        public int hashCode() {
            return 31 * playbook.hashCode() + target.hashCode();
        }

        @Override
        public String toString() {
            return playbook + "@" + target;
        }
    }

    public Key key() {
        return new Key(playbook.id(), target);
    }

    public Candidate withRun(String id) {
        return new Candidate(playbook, target, trigger, problemSince, firstSeen, id, approved, liftedAt);
    }

    public Candidate withApproved() {
        return new Candidate(playbook, target, trigger, problemSince, firstSeen, runId, true, liftedAt);
    }

    public Candidate withProblemSince(Instant since) {
        return new Candidate(playbook, target, trigger, since, firstSeen, runId, approved, liftedAt);
    }

    /** A copy whose confirmation counts again from {@code at}, the moment a mask or exclusion lifted. */
    public Candidate withLiftedAt(Instant at) {
        return new Candidate(playbook, target, trigger, problemSince, firstSeen, runId, approved, at);
    }

    /** Event time from which {@code confirm-for} counts: the later of the onset and the last lift. */
    public Instant confirmingSince() {
        return liftedAt != null && liftedAt.isAfter(problemSince) ? liftedAt : problemSince;
    }
}
