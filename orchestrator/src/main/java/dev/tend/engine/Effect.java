package dev.tend.engine;

import dev.tend.playbooks.ActionDef;
import dev.tend.shared.Target;

import java.time.Duration;
import java.time.Instant;
import java.util.Map;

/**
 * What the engine asks the world to do. The driver commits the ledger entries and
 * projections of one input in one transaction, and only then performs side effects
 * (executor calls, notifications), so an intent is always durable before its act.
 */
public sealed interface Effect {
    /**
     * Append to the audit ledger. {@code fields} are JSON values, among those {@code type}
     * declares (checked when assertions are on, as in every test); "cluster", "playbook",
     * "run" are indexed.
     */
    record Ledger(LedgerKind type, Map<String, Object> fields) implements Effect {
        public Ledger {
            java.util.Objects.requireNonNull(type, "type");
            fields = Map.copyOf(type.check(fields));
        }

        /** The kind as the ledger stores it. */
        public String kind() {
            return type.wire();
        }
    }

    /** Call an executor. {@code key} is the idempotency key {@code run-id/step-id/attempt}. */
    record CallExecutor(String runId, String stepId, int attempt, String key, ActionDef action,
                        Target target, String playbook, Duration timeout) implements Effect {
        /** The idempotency key of attempt {@code attempt} of step {@code stepId} of run {@code runId}: the one place it is made. */
        public static String idempotencyKey(String runId, String stepId, int attempt) {
            return runId + "/" + stepId + "/" + attempt;
        }
    }

    record ArmTimer(String key, Instant due) implements Effect {
    }

    record CancelTimer(String key) implements Effect {
    }

    /**
     * Send a page; {@code id} is unique and stable, for de-duplication downstream. {@code kind}
     * says what it is about (see {@link PageKind}); {@code fields} carry cluster, node, run,
     * playbook and what else the page is about, as JSON values.
     */
    record Notify(String id, String kind, String channel, String message, Map<String, Object> fields) implements Effect {
        public Notify {
            java.util.Objects.requireNonNull(id, "id");
            java.util.Objects.requireNonNull(kind, "kind");
            java.util.Objects.requireNonNull(channel, "channel");
            fields = Map.copyOf(fields);
        }
    }

    /** A run or one of its steps changed: update the projection tables. */
    record RunChanged(RunSnapshot run) implements Effect {
    }

    record ExclusionsChanged(Target target, Exclusion exclusionOrNull) implements Effect {
    }

    record ApprovalChanged(ApprovalSnapshot approval) implements Effect {
    }

    record BrakeChanged(BrakeState brake) implements Effect {
    }

    /** The answer to the operator command {@code command} (its {@code Input.kind()}); exactly one per command. */
    record Answered(String command, CommandAnswer answer) implements Effect {
        public Answered {
            java.util.Objects.requireNonNull(command, "command");
            java.util.Objects.requireNonNull(answer, "answer");
        }
    }
}
