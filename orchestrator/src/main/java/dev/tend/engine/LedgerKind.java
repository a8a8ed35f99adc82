package dev.tend.engine;

import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.function.Function;
import java.util.stream.Collectors;

/**
 * Every kind of ledger entry tend writes, with the fields each may carry: the one list the
 * engine, the driver, the courier, the API and the CLI write with and the handover, the
 * metrics, the replay report, the API and the console read with. The wire name
 * ({@link #wire()}) is what the ledger stores and hashes: contract, never renamed.
 *
 * <p>To add a kind: add a constant here with its wire name and fields, write it where it
 * happens (the engine through {@link Effects#ledger}, an adapter through
 * {@code StoreTx.appendLedger(at, kind.wire(), fields)}), and read it by constant, never by
 * string. The console's ledger filter and {@code tend audit --kind} take the list from here.
 */
public enum LedgerKind {
    POLICY_LOADED("policy-loaded", "playbooks", "actions", "clusters"),
    TRANSITION("transition", "cluster", "node", "signal", "state", "at_event", "unknown_target"),
    TOPOLOGY("topology", "cluster", "node", "change", "at_event"),
    TRANSITIONS_RECEIVED("transitions-received", "by", "from", "accepted", "rejected", "requests"),
    INPUT_REFUSED("input-refused", "input", "cluster", "node", "signal", "event_at", "by", "from", "reason"),
    VERDICT("verdict", "playbook", "cluster", "node", "verdict", "reasons", "messages", "hold_until",
            "hold_until_event_time", "signal", "problem_since", "run"),
    CANDIDATE_DROPPED("candidate-dropped", "playbook", "cluster", "node", "reason", "run"),
    APPROVAL_REQUESTED("approval-requested", "run", "playbook", "cluster", "node", "expires_at", "reasons"),
    APPROVAL_GRANTED("approval-granted", "run", "playbook", "cluster", "node", "by", "from", "reason"),
    APPROVAL_REJECTED("approval-rejected", "run", "playbook", "cluster", "node", "by", "from", "reason"),
    APPROVAL_LAPSED("approval-lapsed", "run", "playbook", "cluster", "node", "expired_at"),
    APPROVAL_REFUSED("approval-refused", "run", "by", "from", "reason"),
    RUN_STARTED("run-started", "run", "playbook", "version", "cluster", "node"),
    RUN_SHADOWED("run-shadowed", "run", "playbook", "cluster", "node", "steps"),
    RUN_PAUSED("run-paused", "run", "playbook", "cluster", "reason"),
    RUN_RESUMED("run-resumed", "run", "playbook", "cluster"),
    RUN_NEEDS_HUMAN("run-needs-human", "run", "playbook", "cluster", "step", "attempt", "reason"),
    RUN_STANDING_DOWN("run-standing-down", "run", "playbook", "cluster", "node", "before_step", "reason", "message", "steps"),
    RUN_ENDED("run-ended", "run", "playbook", "cluster", "node", "state", "outcome", "stand_down"),
    STEP_STARTED("step-started", "run", "playbook", "cluster", "step", "step_kind", "signals", "within"),
    STEP_FINISHED("step-finished", "run", "playbook", "cluster", "step", "state", "channel", "message", "outcome"),
    STEP_FAILED("step-failed", "run", "playbook", "cluster", "step"),
    STEP_TIMED_OUT("step-timed-out", "run", "playbook", "cluster", "step", "attempt"),
    EXECUTOR_CALL("executor-call", "run", "playbook", "cluster", "node", "step", "attempt", "key", "action", "executor", "timeout"),
    EXECUTOR_RESULT("executor-result", "run", "playbook", "cluster", "step", "attempt", "success", "message", "detail"),
    EXECUTOR_RESULT_IGNORED("executor-result-ignored", "run", "step", "attempt", "reason"),
    EXCLUSION_ADDED("exclusion-added", "cluster", "node", "reason", "owner", "until", "by", "from"),
    EXCLUSION_REMOVED("exclusion-removed", "cluster", "node", "by", "from", "existed"),
    BRAKE_ENGAGED("brake-engaged", "by", "reason", "unhealthy_clusters", "manual", "already_engaged_since"),
    BRAKE_RELEASED("brake-released", "by", "reason", "engaged_since"),
    OPERATOR_COMMAND("operator-command", "command", "run", "by", "from", "reason"),
    COMMAND_REFUSED("command-refused", "command", "cluster", "node", "by", "from", "code", "reason"),
    LOOP_STOPPED("loop-stopped", "playbook", "cluster", "node"),
    LOOP_CLEARED("loop-cleared", "playbook", "cluster", "node", "by", "from", "was_stopped"),
    /** A page decided by the engine; besides these, the fields of the page (see {@link #pageFields()}). */
    NOTIFICATION("notification", "id", "page_kind", "channel", "message"),
    /** A page folded into the brake's page instead of sent; besides these, the fields of the page. */
    PAGE_FOLDED("page-folded", "id", "page_kind", "message", "into", "sent"),
    NOTIFICATION_DELIVERED("notification-delivered", "id", "channel", "page_kind", "cluster", "playbook", "run",
            "attempt", "answer", "tries"),
    NOTIFICATION_FAILED("notification-failed", "id", "channel", "page_kind", "cluster", "playbook", "run",
            "attempt", "answer", "tries", "final", "retry_at"),
    CHECKPOINT("checkpoint", "covers_seq", "covers_hash", "key_id", "hmac"),
    /** Journal rows moved out to a file by {@code tend journal archive}; the ledger keeps every entry. */
    JOURNAL_ARCHIVED("journal-archived", "inputs", "first_seq", "last_seq", "before", "snapshot_seq", "to"),
    /** An instance took the leader lease of a shared PostgreSQL store and leads from here on. */
    LEADER_ELECTED("leader-elected", "instance", "address", "epoch");

    private static final Map<String, LedgerKind> BY_WIRE = Arrays.stream(values())
            .collect(Collectors.toUnmodifiableMap(LedgerKind::wire, Function.identity()));

    private final String wire;
    private final Set<String> fields;

    LedgerKind(String wire, String... fields) {
        this.wire = wire;
        Set<String> f = new LinkedHashSet<>(Arrays.asList(fields));
        if (wire.equals("notification") || wire.equals("page-folded")) f.addAll(Page.FIELDS);
        this.fields = Collections.unmodifiableSet(f);
    }

    /** What a page may carry besides its message ({@code Effect.Notify#fields}); its ledger entries carry them too. */
    public static List<String> pageFields() {
        return Page.FIELDS;
    }

    /** The name the ledger stores, e.g. {@code run-started}. */
    public String wire() {
        return wire;
    }

    /** The fields an entry of this kind may carry, in the order they are usually written. */
    public Set<String> fields() {
        return fields;
    }

    /**
     * {@code entry} itself, after checking (when assertions are on, as in every test) that it
     * carries only fields this kind declares: a field written without being declared here
     * fails the build's tests, so the list stays the truth.
     */
    public <M extends Map<String, ?>> M check(M entry) {
        assert fields.containsAll(entry.keySet()) : "ledger kind " + wire + " does not declare the fields "
                + entry.keySet().stream().filter(k -> !fields.contains(k)).toList();
        return entry;
    }

    /** The kind stored as {@code wire}; empty for a kind this version does not write (an older or newer ledger's). */
    public static Optional<LedgerKind> of(String wire) {
        return Optional.ofNullable(BY_WIRE.get(wire));
    }

    @Override
    public String toString() {
        return wire;
    }

    /** Held apart so the constants' constructor can read it (an enum's own statics are not set yet then). */
    private static final class Page {
        static final List<String> FIELDS = List.of("run", "playbook", "cluster", "node", "expires_at",
                "unhealthy_clusters", "folded_pages", "engaged_at", "stand_down");
    }
}
