package dev.tend.engine;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

class TimerKeyTest {
    @Test
    void everyKeyReadsBackFromItsWireFormUnchanged() {
        List<TimerKey> keys = List.of(new TimerKey.Recheck("replace-silent-node/fares-3/n2"), new TimerKey.BrakePage(),
                new TimerKey.BrakeSettle(), new TimerKey.ApprovalExpiry("r000002"), new TimerKey.ApprovalReminder("r000002"),
                new TimerKey.StepTimeout("r000001", "drain", 2), new TimerKey.WaitTimeout("r000003", "settle"));
        for (TimerKey k : keys) assertThat(TimerKey.parse(k.wire())).contains(k);
    }

    @Test
    void theWireFormsAreThoseJournalsAlreadyHold() {
        assertThat(new TimerKey.StepTimeout("r000001", "drain", 1).wire()).isEqualTo("step:r000001:drain:1");
        assertThat(new TimerKey.WaitTimeout("r000003", "settle").wire()).isEqualTo("wait:r000003:settle");
        assertThat(new TimerKey.ApprovalExpiry("r000002").wire()).isEqualTo("approval:r000002");
        assertThat(new TimerKey.ApprovalReminder("r000002").wire()).isEqualTo("approval-reminder:r000002");
        assertThat(new TimerKey.Recheck("p/fares-3/n2").wire()).isEqualTo("recheck:p/fares-3/n2");
        assertThat(new TimerKey.BrakeSettle().wire()).isEqualTo("brake:settle");
        assertThat(new TimerKey.BrakePage().wire()).isEqualTo("brake:page");
    }

    @Test
    void aKeyThisVersionNeverArmsIsNoKey() {
        assertThat(TimerKey.parse("brake:later")).isEmpty();
        assertThat(TimerKey.parse("step:r000001:drain:one")).isEmpty();
        assertThat(TimerKey.parse("step:r000001:drain")).isEmpty();
        assertThat(TimerKey.parse("wait:r000001")).isEmpty();
        assertThat(TimerKey.parse("nap:r000001")).isEmpty();
        assertThat(TimerKey.parse("recheck")).isEmpty();
    }
}
