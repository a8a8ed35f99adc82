package dev.tend.store;

import dev.tend.shared.StepState;
import dev.tend.shared.RunState;
import dev.tend.store.internal.Rows;
import org.assertj.core.api.ThrowableAssert.ThrowingCallable;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.time.Instant;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.params.provider.Arguments.arguments;

/** Every validation rule of the row records and filters, by exception type and message. */
class RowValidationTest {
    static final Instant T = Instant.parse("2027-03-14T02:17:00Z");
    static final Class<NullPointerException> NULL = NullPointerException.class;
    static final Class<IllegalArgumentException> BAD = IllegalArgumentException.class;

    static Stream<Arguments> rules() {
        return Stream.of(
                rule(BAD, "InputRow.seq must be 0 (not yet appended) or positive, got -1",
                        () -> new InputRow(-1, "transition", T, T, "fares-3", "{}")),
                rule(NULL, "InputRow.kind must not be null", () -> InputRow.of(null, T, T, "fares-3", "{}")),
                rule(BAD, "InputRow.kind must not be blank", () -> InputRow.of(" ", T, T, "fares-3", "{}")),
                rule(NULL, "InputRow.now must not be null", () -> InputRow.of("transition", null, T, "fares-3", "{}")),
                rule(NULL, "InputRow.payload must not be null", () -> InputRow.of("transition", T, T, "fares-3", null)),

                rule(NULL, "RunRow.runId must not be null", () -> run(null, "p", 1, "fares-3", RunState.RUNNING, T)),
                rule(NULL, "RunRow.playbook must not be null", () -> run("run-1", null, 1, "fares-3", RunState.RUNNING, T)),
                rule(BAD, "RunRow.playbookVersion must be 0 or more, got -2", () -> run("run-1", "p", -2, "fares-3", RunState.RUNNING, T)),
                rule(NULL, "RunRow.cluster must not be null", () -> run("run-1", "p", 1, null, RunState.RUNNING, T)),
                rule(NULL, "RunRow.state must not be null", () -> run("run-1", "p", 1, "fares-3", null, T)),
                rule(NULL, "RunRow.createdAt must not be null", () -> run("run-1", "p", 1, "fares-3", RunState.RUNNING, null)),

                rule(NULL, "StepRow.runId must not be null", () -> new StepRow(null, "drain", 0, StepState.RUNNING, 1, T, null, null, null)),
                rule(NULL, "StepRow.stepId must not be null", () -> new StepRow("run-1", null, 0, StepState.RUNNING, 1, T, null, null, null)),
                rule(BAD, "StepRow.ordinal must be 0 or more, got -1", () -> new StepRow("run-1", "drain", -1, StepState.RUNNING, 1, T, null, null, null)),
                rule(NULL, "StepRow.state must not be null", () -> new StepRow("run-1", "drain", 0, null, 1, T, null, null, null)),
                rule(BAD, "StepRow.attempt must be 0 or more, got -1", () -> new StepRow("run-1", "drain", 0, StepState.RUNNING, -1, T, null, null, null)),

                rule(NULL, "TimerRow.key must not be null", () -> new TimerRow(null, T, null)),
                rule(BAD, "TimerRow.key must not be empty", () -> new TimerRow("", T, null)),
                rule(NULL, "TimerRow.due must not be null", () -> new TimerRow("hold/fares-3", null, null)),

                rule(NULL, "ExclusionRow.cluster must not be null", () -> new ExclusionRow(null, null, "r", "ops-lena", T, null)),
                rule(BAD, "ExclusionRow.node must be null (whole cluster) or a node id, got an empty string",
                        () -> new ExclusionRow("tickets-12", "", "r", "ops-lena", T, null)),
                rule(NULL, "ExclusionRow.reason must not be null", () -> new ExclusionRow("tickets-12", null, null, "ops-lena", T, null)),
                rule(NULL, "ExclusionRow.owner must not be null", () -> new ExclusionRow("tickets-12", null, "r", null, T, null)),
                rule(NULL, "ExclusionRow.createdAt must not be null", () -> new ExclusionRow("tickets-12", null, "r", "ops-lena", null, null)),
                rule(BAD, "ExclusionRow.until must not be before createdAt 2027-03-14T02:17:00Z, got 2027-03-14T02:16:59Z",
                        () -> new ExclusionRow("tickets-12", null, "r", "ops-lena", T, T.minusSeconds(1))),

                rule(NULL, "ApprovalRow.runId must not be null", () -> approval(null, "p", "fares-3", "engine", T, T, "pending")),
                rule(NULL, "ApprovalRow.playbook must not be null", () -> approval("run-1", null, "fares-3", "engine", T, T, "pending")),
                rule(NULL, "ApprovalRow.cluster must not be null", () -> approval("run-1", "p", null, "engine", T, T, "pending")),
                rule(NULL, "ApprovalRow.requestedBy must not be null", () -> approval("run-1", "p", "fares-3", null, T, T, "pending")),
                rule(NULL, "ApprovalRow.requestedAt must not be null", () -> approval("run-1", "p", "fares-3", "engine", null, T, "pending")),
                rule(NULL, "ApprovalRow.expiresAt must not be null", () -> approval("run-1", "p", "fares-3", "engine", T, null, "pending")),
                rule(BAD, "ApprovalRow.expiresAt must not be before requestedAt 2027-03-14T02:17:00Z, got 2027-03-14T02:16:00Z",
                        () -> approval("run-1", "p", "fares-3", "engine", T, T.minusSeconds(60), "pending")),
                rule(NULL, "ApprovalRow.state must not be null", () -> approval("run-1", "p", "fares-3", "engine", T, T, null)),
                rule(BAD, "ApprovalRow.state must be one of pending, approved, rejected, lapsed, withdrawn, got 'granted'",
                        () -> approval("run-1", "p", "fares-3", "engine", T, T, "granted")),

                rule(BAD, "LedgerEntry.seq must be 1 or more, got 0",
                        () -> new LedgerEntry(0, T, "verdict", null, null, null, "{}", LedgerEntry.GENESIS_HASH, LedgerEntry.GENESIS_HASH)),
                rule(NULL, "LedgerEntry.at must not be null",
                        () -> new LedgerEntry(1, null, "verdict", null, null, null, "{}", LedgerEntry.GENESIS_HASH, LedgerEntry.GENESIS_HASH)),
                rule(NULL, "LedgerEntry.kind must not be null",
                        () -> new LedgerEntry(1, T, null, null, null, null, "{}", LedgerEntry.GENESIS_HASH, LedgerEntry.GENESIS_HASH)),
                rule(NULL, "LedgerEntry.entry must not be null",
                        () -> new LedgerEntry(1, T, "verdict", null, null, null, null, LedgerEntry.GENESIS_HASH, LedgerEntry.GENESIS_HASH)),
                rule(NULL, "LedgerEntry.prevHash must not be null",
                        () -> new LedgerEntry(1, T, "verdict", null, null, null, "{}", null, LedgerEntry.GENESIS_HASH)),
                rule(BAD, "LedgerEntry.hash must be 64 lowercase hex digits, got 'ABC'",
                        () -> new LedgerEntry(1, T, "verdict", null, null, null, "{}", LedgerEntry.GENESIS_HASH, "ABC")),

                rule(BAD, "LedgerVerification.entries must be 0 or more, got -1",
                        () -> new LedgerVerification(true, -1, LedgerEntry.GENESIS_HASH, 0, "r")),
                rule(NULL, "LedgerVerification.headHash must not be null", () -> new LedgerVerification(true, 0, null, 0, "r")),
                rule(NULL, "LedgerVerification.reason must not be null",
                        () -> new LedgerVerification(true, 0, LedgerEntry.GENESIS_HASH, 0, null)),
                rule(BAD, "LedgerVerification.firstBrokenSeq must be 0 when ok, got 3",
                        () -> new LedgerVerification(true, 0, LedgerEntry.GENESIS_HASH, 3, "r")),
                rule(BAD, "LedgerVerification.firstBrokenSeq must name an entry (1 or more) when not ok, got 0",
                        () -> new LedgerVerification(false, 0, LedgerEntry.GENESIS_HASH, 0, "r")),

                rule(BAD, "RunFilter.limit must be 0 (no limit) or more, got -5", () -> RunFilter.all().withLimit(-5)),
                rule(BAD, "LedgerFilter.until must not be before since 2027-03-14T02:17:00Z, got 2027-03-14T02:16:00Z",
                        () -> LedgerFilter.all().withSince(T).withUntil(T.minusSeconds(60))));
    }

    static RunRow run(String id, String playbook, int version, String cluster, RunState state, Instant created) {
        return new RunRow(id, playbook, version, cluster, null, state, false, created, null, null, null, null, null);
    }

    /** An approval row with {@code state} as the store holds it: text, read into an ApprovalState at the store's edge. */
    static ApprovalRow approval(String run, String playbook, String cluster, String by, Instant at, Instant expires, String state) {
        return new ApprovalRow(run, playbook, cluster, null, by, at, expires, state == null ? null : Rows.approvalState(state), null, null, null);
    }

    static Arguments rule(Class<? extends Throwable> type, String message, ThrowingCallable make) {
        return arguments(message, type, make);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rules")
    void rejectsInvalidValuesNamingTheFieldAndTheLimit(String message, Class<? extends Throwable> type, ThrowingCallable make) {
        assertThatThrownBy(make).isExactlyInstanceOf(type).hasMessage(message);
    }
}
