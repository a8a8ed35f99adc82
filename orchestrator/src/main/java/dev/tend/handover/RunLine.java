package dev.tend.handover;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * One run as the ledger shows it at the end of a report's period.
 *
 * @param run       the run's id
 * @param playbook  its playbook
 * @param cluster   its cluster
 * @param node      its node; null for a cluster-scoped run
 * @param createdAt its first ledger entry (an approval request, the start, or the shadow decision)
 * @param startedAt when it began executing; null if it never did (yet)
 * @param endedAt   when it ended; null while it has not
 * @param state     one of {@link #STATES}, as of the period's end
 * @param note      how it ended, or why it waits (needs a person, paused); null when neither
 * @param actions   the actions that succeeded on it, in order, each once (e.g. drain-node, replace-node)
 */
public record RunLine(String run, String playbook, String cluster, String node, Instant createdAt, Instant startedAt,
                      Instant endedAt, String state, String note, List<String> actions) {
    public static final String AWAITING_APPROVAL = "awaiting-approval";
    public static final String APPROVED = "approved";
    public static final String RUNNING = "running";
    public static final String PAUSED = "paused";
    public static final String NEEDS_HUMAN = "needs-human";
    public static final String SUCCEEDED = "succeeded";
    public static final String FAILED = "failed";
    public static final String CANCELLED = "cancelled";
    public static final String SHADOWED = "shadowed";
    public static final String STOOD_DOWN = "stood-down";
    /** Every state a run line can be in; the last five are ends. */
    public static final Set<String> STATES = Set.of(AWAITING_APPROVAL, APPROVED, RUNNING, PAUSED, NEEDS_HUMAN,
            SUCCEEDED, FAILED, CANCELLED, SHADOWED, STOOD_DOWN);

    public RunLine {
        Objects.requireNonNull(run, "RunLine.run must not be null");
        Objects.requireNonNull(playbook, "RunLine.playbook must not be null");
        Objects.requireNonNull(cluster, "RunLine.cluster must not be null");
        Objects.requireNonNull(createdAt, "RunLine.createdAt must not be null");
        Objects.requireNonNull(state, "RunLine.state must not be null");
        if (!STATES.contains(state)) {
            throw new IllegalArgumentException("RunLine.state must be one of awaiting-approval, approved, running, paused,"
                    + " needs-human, succeeded, failed, cancelled, shadowed, stood-down, got '" + state + "'");
        }
        if (startedAt != null && startedAt.isBefore(createdAt)) {
            throw new IllegalArgumentException("RunLine.startedAt must not be before createdAt " + createdAt + ", got " + startedAt);
        }
        if (endedAt != null && endedAt.isBefore(createdAt)) {
            throw new IllegalArgumentException("RunLine.endedAt must not be before createdAt " + createdAt + ", got " + endedAt);
        }
        if (isEnd(state) != (endedAt != null)) {
            throw new IllegalArgumentException("RunLine.endedAt must be set exactly when the state is an end (succeeded,"
                    + " failed, cancelled, shadowed, stood-down); state '" + state + "', endedAt " + endedAt);
        }
        actions = List.copyOf(Objects.requireNonNull(actions, "RunLine.actions must not be null (pass an empty list)"));
    }

    /** True for the states a run ends in. */
    public static boolean isEnd(String state) {
        return SUCCEEDED.equals(state) || FAILED.equals(state) || CANCELLED.equals(state) || SHADOWED.equals(state)
                || STOOD_DOWN.equals(state);
    }

    public boolean hasEnded() {
        return endedAt != null;
    }

    public boolean isNeedingPerson() {
        return NEEDS_HUMAN.equals(state);
    }

    /** "cluster/node", or the cluster for a cluster-scoped run. */
    public String target() {
        return node == null ? cluster : cluster + "/" + node;
    }
}
