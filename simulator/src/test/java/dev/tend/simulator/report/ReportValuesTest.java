package dev.tend.simulator.report;

import dev.tend.shared.fleet.BrakePeriod;
import dev.tend.shared.Id;
import dev.tend.shared.ReasonCode;
import org.junit.jupiter.api.function.Executable;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.time.Duration;
import java.util.List;
import java.util.stream.Stream;

import static dev.tend.simulator.report.Fixtures.at;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class ReportValuesTest {
    static Stream<Arguments> invalid() {
        Id c = Id.of("tickets-12");
        RunEntry run = Fixtures.run("r000001", "tickets-12", "n2", 5, 26, "succeeded");
        return Stream.of(
                Arguments.of("negative held", (Executable) () -> new Summary(0, 0, 0, -1, 0, 0, 0, false, 0, 0, 0),
                        "held must be at least 0, got -1"),
                Arguments.of("more ended than started", (Executable) () -> new Summary(1, 1, 1, 0, 0, 0, 0, false, 0, 0, 0),
                        "runs_succeeded + runs_failed + runs_unfinished + runs_stood_down (2) must not exceed runs_started (1)"),
                Arguments.of("run ends before it starts", (Executable) () -> new RunEntry("r1", c, c, null, at(10), at(5), "succeeded", null, List.of()),
                        "run r1: endedAt (2027-03-16T01:05:00Z) must not be before startedAt (2027-03-16T01:10:00Z)"),
                Arguments.of("brake released before engaged", (Executable) () -> new BrakePeriod(at(10), "automatic", "x", at(5), null, null),
                        "BrakePeriod.releasedAt must not be before engagedAt 2027-03-16T01:10:00Z, got 2027-03-16T01:05:00Z"),
                Arguments.of("mask lifted before it began", (Executable) () -> new HiddenMask(c, null, c, at(10), "r1", "a", at(5), 0),
                        "liftedAt (2027-03-16T01:05:00Z) must not be before maskedAt (2027-03-16T01:10:00Z)"),
                Arguments.of("negative hidden count", (Executable) () -> new HiddenMask(c, null, c, at(10), "r1", "a", null, -2),
                        "hiddenEvents must be at least 0, got -2"),
                Arguments.of("negative step attempt", (Executable) () -> new StepEntry("drain", "action", "running", -1, null, null, null),
                        "attempt must be at least 0, got -1"),
                Arguments.of("negative unhealthy count", (Executable) () -> new HealthPoint(at(0), -1),
                        "unhealthyClusters must be at least 0, got -1"),
                Arguments.of("zero health interval", (Executable) () -> new ReplayInfo(1, List.of(), null, "f", 1, Duration.ZERO),
                        "healthInterval must be longer than zero, got PT0S"),
                Arguments.of("flag not 0 or 1", (Executable) () -> new SummaryDelta("brake_engaged", 2, 0, true),
                        "a yes/no field (brake_engaged) holds 0 or 1, got 2 and 0"),
                Arguments.of("only-in-a with a run in B", (Executable) () -> new RunDifference(RunDifference.Kind.ONLY_IN_A, c, c, null, 1, run, run),
                        "only-in-a needs a run in A and none in B"),
                Arguments.of("outcome without B", (Executable) () -> new RunDifference(RunDifference.Kind.OUTCOME, c, c, null, 1, run, null),
                        "outcome needs a run in A and in B"),
                Arguments.of("occurrence 0", (Executable) () -> new RunDifference(RunDifference.Kind.ONLY_IN_A, c, c, null, 0, run, null),
                        "occurrence must be at least 1, got 0"),
                Arguments.of("equal reasons", (Executable) () -> new ReasonDifference(c, c, null, List.of(ReasonCode.LOOP), List.of(ReasonCode.LOOP)),
                        "a reason difference needs different reasons, got [LOOP] in both"));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("invalid")
    void rejectsInvalidValuesWithAMessageNamingTheFieldAndTheLimit(String name, Executable make, String message) {
        assertThatThrownBy(make::execute).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }
}
