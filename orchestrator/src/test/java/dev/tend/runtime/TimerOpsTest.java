package dev.tend.runtime;

import dev.tend.engine.Effect;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.List;
import java.util.Set;

import static org.assertj.core.api.Assertions.assertThat;

class TimerOpsTest {
    private static final Instant T = Instant.parse("2027-03-14T02:00:00Z");

    @Test
    void onlyTheLastArmOrCancelOfEachKeyIsLeftAndEveryOtherEffectStays() {
        Effect armA = new Effect.ArmTimer("recheck/fares-3/n1", T.plusSeconds(120));
        Effect cancelA = new Effect.CancelTimer("recheck/fares-3/n1");
        Effect armB = new Effect.ArmTimer("recheck/dispatch-1/n2", T.plusSeconds(60));
        Effect armBLater = new Effect.ArmTimer("recheck/dispatch-1/n2", T.plusSeconds(90));
        Effect cancelC = new Effect.CancelTimer("approval-expiry/r000007");
        Effect armAAgain = new Effect.ArmTimer("recheck/fares-3/n1", T.plusSeconds(300));
        Effect cancelAAgain = new Effect.CancelTimer("recheck/fares-3/n1");

        Set<Effect> replaced = TimerOps.superseded(List.of(armA, cancelA, armB, armBLater, cancelC, armAAgain, cancelAAgain));

        // fares-3/n1 is cancelled in the end, dispatch-1/n2 armed for 90 s, the approval expiry cancelled
        assertThat(replaced).containsExactlyInAnyOrder(armA, cancelA, armB, armAAgain);
    }

    @Test
    void twoEqualOperationsOfAKeyAreToldApartByPosition() {
        Effect first = new Effect.ArmTimer("brake-page", T);
        Effect second = new Effect.ArmTimer("brake-page", T);

        Set<Effect> replaced = TimerOps.superseded(List.of(first, second));

        assertThat(replaced).hasSize(1);
        assertThat(replaced.contains(first)).isTrue();
        assertThat(replaced.contains(second)).isFalse();
    }

    @Test
    void aBatchWithoutRepeatsReplacesNothing() {
        assertThat(TimerOps.superseded(List.of(new Effect.ArmTimer("a", T), new Effect.CancelTimer("b")))).isEmpty();
        assertThat(TimerOps.superseded(List.of())).isEmpty();
    }
}
