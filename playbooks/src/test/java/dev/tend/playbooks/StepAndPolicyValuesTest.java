package dev.tend.playbooks;

import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Validation of steps, triggers, approvals, freezes and the fleet brake. */
class StepAndPolicyValuesTest {
    private static final Id STEP = Id.of("drain");

    @Test
    void actionStepRejectsBadTimeoutAndRetries() {
        assertThatThrownBy(() -> new ActionStep(STEP, Id.of("drain-node"), Duration.ZERO, 0))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("step drain timeout must be longer than zero, got PT0S");
        assertThatThrownBy(() -> new ActionStep(STEP, Id.of("drain-node"), null, 11))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("step drain retries must be between 0 and 10, got 11");
        assertThat(new ActionStep(STEP, Id.of("drain-node"), null, 0).kind()).isEqualTo("action");
    }

    @Test
    void waitHealthyNeedsSignalsAndAPositiveWithin() {
        assertThatThrownBy(() -> new WaitHealthyStep(STEP, List.of(), Duration.ofMinutes(1)))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("step drain wait-healthy must name at least one signal");
        assertThatThrownBy(() -> new WaitHealthyStep(STEP, List.of(Id.of("heartbeat")), Duration.ZERO))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("step drain within must be longer than zero, got PT0S");
    }

    @Test
    void notifyMessageMayUseOnlyMessagePlaceholders() {
        assertThatThrownBy(() -> new PageStep(STEP, Id.of("oncall"), new Template("{key}")))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("step drain message uses unknown placeholder {key}");
    }

    @Test
    void triggerRejectsClearAndNegativeConfirmation() {
        assertThatThrownBy(() -> Trigger.of("heartbeat", SignalState.CLEAR, Scope.NODE))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("trigger.state must be breach or silent: a playbook reacts to a problem, and clear ends one");
        assertThatThrownBy(() -> new Trigger(Id.of("heartbeat"), SignalState.SILENT, Scope.NODE, Duration.ofSeconds(-1), null))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("trigger.confirm-for must not be negative, got PT-1S");
    }

    @Test
    void approvalExpiryMustBePositive() {
        assertThatThrownBy(() -> new ApprovalPolicy(TagSelector.all(), Duration.ZERO))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("approval.expires-after must be longer than zero, got PT0S");
    }

    @Test
    void freezeNeedsUntilAfterFromAndAReason() {
        Instant from = Instant.parse("2027-12-24T00:00:00Z");
        assertThatThrownBy(() -> new Freeze(from, from, "holidays", null)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("freeze until (2027-12-24T00:00:00Z) must be after from (2027-12-24T00:00:00Z)");
        assertThatThrownBy(() -> new Freeze(from, from.plusSeconds(60), " ", null)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("freeze reason must say why");
    }

    @ParameterizedTest(name = "{0} of 300 unhealthy: engage {1}, auto-release {2}")
    @CsvSource({
            "5, false, true",     // below both release measures
            "9, false, false",    // below 10 clusters, but 9/300 is 0.03, which is not below 0.03
            "15, false, false",   // between the thresholds: neither engage nor release (hysteresis)
            "24, true, false",    // 24/300 = 0.08 reaches the fraction before the count
            "25, true, false",
    })
    void brakeEngagesAtEitherMeasureAndReleasesBelowAll(int unhealthy, boolean engage, boolean release) {
        BrakePolicy b = new BrakePolicy(new BrakeThreshold(25, 0.08), new BrakeThreshold(10, 0.03), true, Id.of("oncall"));

        assertThat(b.shouldEngage(unhealthy, 300)).isEqualTo(engage);
        assertThat(b.shouldAutoRelease(unhealthy, 300)).isEqualTo(release);
    }

    @Test
    void brakeWithoutAutoReleaseNeverReleasesByItself() {
        BrakePolicy b = BrakePolicy.builtIn();

        assertThat(b.shouldEngage(20, 1000)).isTrue();
        assertThat(b.shouldEngage(19, 1000)).isFalse();
        assertThat(b.shouldAutoRelease(0, 1000)).isFalse();
    }

    @Test
    void brakeRejectsReleaseAtOrAboveEngageAndAutoReleaseWithoutThreshold() {
        assertThatThrownBy(() -> new BrakePolicy(new BrakeThreshold(10, null), new BrakeThreshold(12, null), true, Id.of("oncall")))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("brake.release-below.clusters (12) must be lower than"
                        + " engage-at.clusters (10), or the brake would release as soon as it engages");
        assertThatThrownBy(() -> new BrakePolicy(new BrakeThreshold(10, null), null, true, Id.of("oncall")))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("brake.auto-release needs brake.release-below: without"
                        + " it the brake would never know when to let go");
        assertThatThrownBy(() -> new BrakeThreshold(null, null)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a brake threshold needs clusters, fraction or both");
    }

    @Test
    void playbookPositionFallsBackToWhereThePlaybookStarts() {
        Playbook p = new Playbook(Id.of("p"), 1, null, Mode.LIVE, Trigger.of("heartbeat", SignalState.SILENT, Scope.NODE), List.of(),
                null, null, null, List.of(new ActionStep(STEP, Id.of("drain-node"), null, 0)), List.of(), "p.yaml", "00", 1, 11,
                Map.of("trigger", new Position(2, 1)), List.of());

        assertThat(p.position("trigger")).isEqualTo(new Position(2, 1));
        assertThat(p.position("window")).isEqualTo(new Position(1, 11));
        assertThat(p.step(STEP)).isPresent();
    }
}
