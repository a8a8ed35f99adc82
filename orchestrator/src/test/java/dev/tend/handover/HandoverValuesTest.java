package dev.tend.handover;

import dev.tend.shared.fleet.BrakePeriod;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.MethodSource;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.params.provider.Arguments.arguments;

/** Every validation rule of the handover values, by type and message; and their small behaviours. */
class HandoverValuesTest {
    private static final Instant T = Instant.parse("2027-03-14T02:00:00Z");
    private static final Instant EARLIER = T.minusSeconds(60);
    private static final String HASH = "ab".repeat(32);
    private static final IllegalArgumentException IAE = new IllegalArgumentException();
    private static final NullPointerException NPE = new NullPointerException();
    private static final LedgerStatus LEDGER = new LedgerStatus(0, 0, "0".repeat(64), true, 0, "ok", 0);

    static Stream<Arguments> invalid() {
        return Stream.of(
                bad("period without since", () -> new ReportPeriod(null, T), NPE, "ReportPeriod.since must not be null"),
                bad("period without until", () -> new ReportPeriod(T, null), NPE, "ReportPeriod.until must not be null"),
                bad("empty period", () -> new ReportPeriod(T, T), IAE,
                        "ReportPeriod.until must be after since 2027-03-14T02:00:00Z, got 2027-03-14T02:00:00Z"),
                bad("period backwards", () -> new ReportPeriod(T, EARLIER), IAE,
                        "ReportPeriod.until must be after since 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("negative started", () -> new RunCounts(-1, 0, 0, 0, 0, 0, 0, 0), IAE, "RunCounts.started must be 0 or more, got -1"),
                bad("negative succeeded", () -> new RunCounts(0, -1, 0, 0, 0, 0, 0, 0), IAE, "RunCounts.succeeded must be 0 or more, got -1"),
                bad("negative failed", () -> new RunCounts(0, 0, -1, 0, 0, 0, 0, 0), IAE, "RunCounts.failed must be 0 or more, got -1"),
                bad("negative cancelled", () -> new RunCounts(0, 0, 0, -1, 0, 0, 0, 0), IAE, "RunCounts.cancelled must be 0 or more, got -1"),
                bad("negative shadowed", () -> new RunCounts(0, 0, 0, 0, -1, 0, 0, 0), IAE, "RunCounts.shadowed must be 0 or more, got -1"),
                bad("negative held", () -> new RunCounts(0, 0, 0, 0, 0, -1, 0, 0), IAE, "RunCounts.held must be 0 or more, got -1"),
                bad("negative denied", () -> new RunCounts(0, 0, 0, 0, 0, 0, -1, 0), IAE, "RunCounts.denied must be 0 or more, got -1"),
                bad("reason without code", () -> new ReasonCount(null, 0, 0), NPE, "ReasonCount.code must not be null"),
                bad("reason with blank code", () -> new ReasonCount(" ", 0, 0), IAE, "ReasonCount.code must not be blank"),
                bad("reason negative held", () -> new ReasonCount("quorum", -2, 0), IAE, "ReasonCount.held must be 0 or more, got -2"),
                bad("reason negative denied", () -> new ReasonCount("loop", 0, -3), IAE, "ReasonCount.denied must be 0 or more, got -3"),
                bad("run without id", () -> run(null, "p", "c", T, null, null, "running", List.of()), NPE, "RunLine.run must not be null"),
                bad("run without playbook", () -> run("r1", null, "c", T, null, null, "running", List.of()), NPE,
                        "RunLine.playbook must not be null"),
                bad("run without cluster", () -> run("r1", "p", null, T, null, null, "running", List.of()), NPE,
                        "RunLine.cluster must not be null"),
                bad("run without createdAt", () -> run("r1", "p", "c", null, null, null, "running", List.of()), NPE,
                        "RunLine.createdAt must not be null"),
                bad("run without state", () -> run("r1", "p", "c", T, null, null, null, List.of()), NPE, "RunLine.state must not be null"),
                bad("run in an unknown state", () -> run("r1", "p", "c", T, null, null, "done", List.of()), IAE,
                        "RunLine.state must be one of awaiting-approval, approved, running, paused, needs-human, succeeded,"
                                + " failed, cancelled, shadowed, stood-down, got 'done'"),
                bad("run started before created", () -> run("r1", "p", "c", T, EARLIER, null, "running", List.of()), IAE,
                        "RunLine.startedAt must not be before createdAt 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("run ended before created", () -> run("r1", "p", "c", T, null, EARLIER, "failed", List.of()), IAE,
                        "RunLine.endedAt must not be before createdAt 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("run ended but running", () -> run("r1", "p", "c", T, T, T, "running", List.of()), IAE,
                        "RunLine.endedAt must be set exactly when the state is an end (succeeded, failed, cancelled, shadowed, stood-down);"
                                + " state 'running', endedAt 2027-03-14T02:00:00Z"),
                bad("run succeeded without an end", () -> run("r1", "p", "c", T, T, null, "succeeded", List.of()), IAE,
                        "RunLine.endedAt must be set exactly when the state is an end (succeeded, failed, cancelled, shadowed, stood-down);"
                                + " state 'succeeded', endedAt null"),
                bad("run without actions", () -> run("r1", "p", "c", T, null, null, "running", null), NPE,
                        "RunLine.actions must not be null (pass an empty list)"),
                bad("approval without run", () -> approval(null, "p", "c", T, T, "pending", null), NPE, "ApprovalLine.run must not be null"),
                bad("approval without playbook", () -> approval("r1", null, "c", T, T, "pending", null), NPE,
                        "ApprovalLine.playbook must not be null"),
                bad("approval without cluster", () -> approval("r1", "p", null, T, T, "pending", null), NPE,
                        "ApprovalLine.cluster must not be null"),
                bad("approval without requestedAt", () -> approval("r1", "p", "c", null, T, "pending", null), NPE,
                        "ApprovalLine.requestedAt must not be null"),
                bad("approval without expiresAt", () -> approval("r1", "p", "c", T, null, "pending", null), NPE,
                        "ApprovalLine.expiresAt must not be null"),
                bad("approval expiring before asked", () -> approval("r1", "p", "c", T, EARLIER, "pending", null), IAE,
                        "ApprovalLine.expiresAt must not be before requestedAt 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("approval without state", () -> approval("r1", "p", "c", T, T, null, null), NPE, "ApprovalLine.state must not be null"),
                bad("approval in an unknown state", () -> approval("r1", "p", "c", T, T, "maybe", null), IAE,
                        "ApprovalLine.state must be one of pending, approved, rejected, lapsed, withdrawn, got 'maybe'"),
                bad("pending approval with a decision time", () -> approval("r1", "p", "c", T, T, "pending", T), IAE,
                        "ApprovalLine.decidedAt must be null exactly while pending; state 'pending', decidedAt 2027-03-14T02:00:00Z"),
                bad("lapsed approval without a time", () -> approval("r1", "p", "c", T, T, "lapsed", null), IAE,
                        "ApprovalLine.decidedAt must be null exactly while pending; state 'lapsed', decidedAt null"),
                bad("approval decided before asked", () -> approval("r1", "p", "c", T, T, "approved", EARLIER), IAE,
                        "ApprovalLine.decidedAt must not be before requestedAt 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("brake without engagedAt", () -> new BrakePeriod(null, "ana", null, null, null, null), NPE,
                        "BrakePeriod.engagedAt must not be null"),
                bad("brake without engagedBy", () -> new BrakePeriod(T, null, null, null, null, null), NPE,
                        "BrakePeriod.engagedBy must not be null"),
                bad("brake released before engaged", () -> new BrakePeriod(T, "ana", null, EARLIER, "ben", null), IAE,
                        "BrakePeriod.releasedAt must not be before engagedAt 2027-03-14T02:00:00Z, got 2027-03-14T01:59:00Z"),
                bad("brake released by someone while engaged", () -> new BrakePeriod(T, "ana", null, null, "ben", null), IAE,
                        "BrakePeriod.releasedBy must be null while the brake is engaged (releasedAt null), got 'ben'"),
                bad("ledger with negative entries", () -> new LedgerStatus(-1, 0, HASH, true, 0, "ok", 0), IAE,
                        "LedgerStatus.entries must be 0 or more, got -1"),
                bad("ledger with negative entries in period", () -> new LedgerStatus(0, -1, HASH, true, 0, "ok", 0), IAE,
                        "LedgerStatus.entriesInPeriod must be 0 or more, got -1"),
                bad("ledger without head", () -> new LedgerStatus(0, 0, null, true, 0, "ok", 0), NPE,
                        "LedgerStatus.headHash must not be null"),
                bad("ledger head not a hash", () -> new LedgerStatus(0, 0, "ABC", true, 0, "ok", 0), IAE,
                        "LedgerStatus.headHash must be 64 lowercase hex digits, got 'ABC'"),
                bad("verified ledger with a broken entry", () -> new LedgerStatus(9, 0, HASH, true, 4, "ok", 0), IAE,
                        "LedgerStatus.firstBrokenSeq must be 0 exactly when verified, got 4 with verified true"),
                bad("broken ledger without a broken entry", () -> new LedgerStatus(9, 0, HASH, false, 0, "broken", 0), IAE,
                        "LedgerStatus.firstBrokenSeq must be 0 exactly when verified, got 0 with verified false"),
                bad("broken ledger with a negative entry", () -> new LedgerStatus(9, 0, HASH, false, -1, "broken", 0), IAE,
                        "LedgerStatus.firstBrokenSeq must be 0 or more, got -1"),
                bad("ledger without a verify message", () -> new LedgerStatus(0, 0, HASH, true, 0, null, 0), NPE,
                        "LedgerStatus.verifyMessage must not be null"),
                bad("ledger with negative unreadable", () -> new LedgerStatus(0, 0, HASH, true, 0, "ok", -1), IAE,
                        "LedgerStatus.unreadable must be 0 or more, got -1"),
                bad("report without period", () -> report(null, Map.of(), List.of()), NPE, "HandoverReport.period must not be null"),
                bad("report without playbooks", () -> report(ReportPeriod.of(EARLIER, T), null, List.of()), NPE,
                        "HandoverReport.byPlaybook must not be null"),
                bad("report without runs", () -> report(ReportPeriod.of(EARLIER, T), Map.of(), null), NPE,
                        "HandoverReport.runs must not be null"),
                bad("report without reasons", () -> new HandoverReport(ReportPeriod.of(EARLIER, T), Map.of(), null, List.of(),
                        List.of(), List.of(), List.of(), LEDGER), NPE, "HandoverReport.byReason must not be null"),
                bad("report without approvals", () -> new HandoverReport(ReportPeriod.of(EARLIER, T), Map.of(), List.of(), List.of(),
                        null, List.of(), List.of(), LEDGER), NPE, "HandoverReport.approvals must not be null"),
                bad("report without brake periods", () -> new HandoverReport(ReportPeriod.of(EARLIER, T), Map.of(), List.of(),
                        List.of(), List.of(), null, List.of(), LEDGER), NPE, "HandoverReport.brakePeriods must not be null"),
                bad("report without ledger", () -> new HandoverReport(ReportPeriod.of(EARLIER, T), Map.of(), List.of(), List.of(),
                        List.of(), List.of(), List.of(), null), NPE, "HandoverReport.ledger must not be null"),
                bad("report without loop stops", () -> new HandoverReport(ReportPeriod.of(EARLIER, T), Map.of(), List.of(),
                        List.of(), List.of(), List.of(), null, LEDGER), NPE, "HandoverReport.loopsStopped must not be null"),
                bad("loop stop without playbook", () -> new LoopStop(null, "fares-1", "n1", T), NPE, "LoopStop.playbook must not be null"),
                bad("loop stop without cluster", () -> new LoopStop("p", null, "n1", T), NPE, "LoopStop.cluster must not be null"),
                bad("loop stop without time", () -> new LoopStop("p", "fares-1", "n1", null), NPE, "LoopStop.stoppedAt must not be null"));
    }

    @ParameterizedTest(name = "[{index}] {0}")
    @MethodSource("invalid")
    void rejectsInvalidValuesNamingTheFieldAndTheLimit(String name, Executable make, RuntimeException type, String message) {
        assertThatThrownBy(make::execute).isExactlyInstanceOf(type.getClass()).hasMessage(message);
    }

    @Test
    void periodIsHalfOpen() {
        ReportPeriod p = ReportPeriod.of(EARLIER, T);

        assertThat(p.contains(EARLIER)).isTrue();
        assertThat(p.contains(T.minusNanos(1))).isTrue();
        assertThat(p.contains(T)).isFalse();
        assertThat(p.contains(EARLIER.minusNanos(1))).isFalse();
        assertThat(p.length()).isEqualTo(Duration.ofMinutes(1));
    }

    @Test
    void countsAddUpFieldByField() {
        RunCounts sum = new RunCounts(1, 2, 3, 4, 5, 6, 7, 8).plus(new RunCounts(10, 20, 30, 40, 50, 60, 70, 80));

        assertThat(sum).isEqualTo(new RunCounts(11, 22, 33, 44, 55, 66, 77, 88));
        assertThat(sum.ended()).isEqualTo(22 + 33 + 44 + 55 + 88);
    }

    @Test
    void anApprovalPendingPastItsExpiryIsOverdue() {
        ApprovalLine a = new ApprovalLine("r1", "p", "fares-9", "n1", EARLIER, T, "pending", null, null);

        assertThat(a.isOverdueAt(T.minusSeconds(1))).isFalse();
        assertThat(a.isOverdueAt(T)).isTrue();
        assertThat(a.target()).isEqualTo("fares-9/n1");
    }

    @ParameterizedTest(name = "[{index}] {0} s is {1}")
    @CsvSource({"0, 0s", "20, 20s", "60, 1m", "90, 1m30s", "1800, 30m", "3600, 1h", "5400, 1h30m", "28800, 8h",
            "90000, 1d1h", "90061, 1d1h"})
    void spansAreWrittenShort(long seconds, String text) {
        assertThat(TimeText.span(Duration.ofSeconds(seconds))).isEqualTo(text);
    }

    private static Arguments bad(String name, Executable make, RuntimeException type, String message) {
        return arguments(name, make, type, message);
    }

    private static RunLine run(String id, String playbook, String cluster, Instant created, Instant started, Instant ended,
                               String state, List<String> actions) {
        return new RunLine(id, playbook, cluster, "n1", created, started, ended, state, null, actions);
    }

    private static ApprovalLine approval(String id, String playbook, String cluster, Instant requested, Instant expires,
                                         String state, Instant decided) {
        return new ApprovalLine(id, playbook, cluster, "n1", requested, expires, state, null, decided);
    }

    private static HandoverReport report(ReportPeriod p, Map<String, RunCounts> byPlaybook, List<RunLine> runs) {
        return new HandoverReport(p, byPlaybook, List.of(), runs, List.of(), List.of(), List.of(), LEDGER);
    }
}
