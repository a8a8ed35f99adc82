package dev.tend.runtime;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** When snapshots are written: the default follows the health view's signals, within bounds; a fixed interval is exact. */
class SnapshotPolicyTest {
    @ParameterizedTest
    @CsvSource({
            "0, 50000",          // nothing seen yet: the floor
            "1000, 50000",       // a small fleet: the floor
            "10000, 50000",
            "10001, 50005",      // five inputs a signal
            "20000, 100000",
            "40000, 200000",
            "50000, 200000",
            "56000, 200000",     // the ingest benchmark's 2,000 clusters: the cap
            "700000, 200000",    // 25,000 clusters: the cap, what a start may have to replay
    })
    void theDefaultIntervalIsFiveInputsASignalWithinFloorAndCap(int signals, long interval) {
        assertThat(SnapshotPolicy.scaled().intervalFor(signals)).isEqualTo(interval);
        assertThat(Orchestrator.DEFAULT_SNAPSHOTS).isEqualTo(SnapshotPolicy.scaled());
    }

    @Test
    void aFixedIntervalIsKeptWhateverTheState() {
        assertThat(SnapshotPolicy.every(3).intervalFor(56_000)).isEqualTo(3);
        assertThat(SnapshotPolicy.every(50_000).intervalFor(0)).isEqualTo(50_000);
        assertThat(SnapshotPolicy.every(3).isEnabled()).isTrue();
        assertThat(SnapshotPolicy.scaled().isEnabled()).isTrue();
    }

    @Test
    void aSnapshotIsDueOnceTheIntervalForTheSignalsKnownIsReached() {
        // 56,000 signals: 280,000 inputs a signal would take, held at the cap of 200,000
        assertThat(SnapshotPolicy.scaled().isDue(199_999, 56_000)).isFalse();
        assertThat(SnapshotPolicy.scaled().isDue(200_000, 56_000)).isTrue();
        // 2,000 signals: 10,000, raised to the floor of 50,000
        assertThat(SnapshotPolicy.scaled().isDue(49_999, 2_000)).isFalse();
        assertThat(SnapshotPolicy.scaled().isDue(50_000, 2_000)).isTrue();
        assertThat(SnapshotPolicy.every(3).isDue(3, 56_000)).isTrue();
        assertThat(SnapshotPolicy.every(0).isDue(Long.MAX_VALUE, 56_000)).as("never when off").isFalse();
    }

    @Test
    void zeroMeansNever() {
        assertThat(SnapshotPolicy.every(0).isEnabled()).isFalse();
        assertThat(SnapshotPolicy.every(0).toString()).isEqualTo("never");
    }

    @Test
    void badValuesAreRefusedWithTheField() {
        assertThatThrownBy(() -> SnapshotPolicy.every(-1)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("snapshot every must be 0 (never) or more inputs, got -1");
        assertThatThrownBy(() -> new SnapshotPolicy(10, true)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a scaled snapshot policy takes no fixed interval, got 10");
    }
}
