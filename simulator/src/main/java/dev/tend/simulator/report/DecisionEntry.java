package dev.tend.simulator.report;

import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;
import dev.tend.shared.Verdict;

import java.time.Instant;
import java.util.List;
import java.util.Objects;

/**
 * One verdict of a replay, as the engine ledgered it: a new verdict is ledgered when a
 * candidate is first looked at and each time its verdict or its reasons change.
 *
 * @param at        the (virtual) time of the verdict
 * @param node      null for a cluster-scope candidate
 * @param reasons   reason codes in guard order; empty for start
 * @param signal    the signal whose transition made the candidate
 * @param holdUntil when a time-based hold may be over, or null
 */
public record DecisionEntry(Instant at, Id playbook, Id cluster, Id node, Verdict verdict, List<ReasonCode> reasons,
                            Id signal, Instant holdUntil) {
    public DecisionEntry {
        Objects.requireNonNull(at, "at");
        Objects.requireNonNull(playbook, "playbook");
        Objects.requireNonNull(cluster, "cluster");
        Objects.requireNonNull(verdict, "verdict");
        reasons = List.copyOf(reasons);
    }

    public String target() {
        return node == null ? cluster.value() : cluster + "/" + node;
    }
}
