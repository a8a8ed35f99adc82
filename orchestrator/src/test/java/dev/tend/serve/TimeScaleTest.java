package dev.tend.serve;

import dev.tend.shared.time.Timers;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Duration;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** How an accelerated server's processing clock and its timers map onto the wall clock. */
class TimeScaleTest {
    private static final Instant START = Instant.parse("2027-03-14T02:00:00Z");
    private static final Instant WALL = Instant.parse("2026-12-01T09:00:00Z");

    private final AtomicLong nanos = new AtomicLong(5_000_000_000L);

    @Test
    void processingClockRunsFactorTimesFasterThanTheWallClock() {
        TimeScale scale = TimeScale.accelerated(START, 10, WALL, nanos::get);
        assertThat(scale.clock().instant()).isEqualTo(START);

        nanos.addAndGet(Duration.ofMillis(1500).toNanos());

        assertThat(scale.clock().instant()).isEqualTo(START.plusSeconds(15));
        assertThat(scale.factor()).isEqualTo(10);
        assertThat(scale.isReal()).isFalse();
    }

    @Test
    void aTimerIsArmedForTheWallInstantAtWhichTheProcessingClockReachesItsDueTime() {
        TimeScale scale = TimeScale.accelerated(START, 60, WALL, nanos::get);
        Map<String, Instant> armed = new LinkedHashMap<>();
        Timers wall = new Timers() {
            @Override
            public void arm(String key, Instant due) {
                armed.put(key, due);
            }

            @Override
            public void cancel(String key) {
                armed.remove(key);
            }
        };
        Timers timers = scale.onProcessingTime(wall);

        timers.arm("approval-expiry/r1", START.plus(Duration.ofMinutes(30)));
        timers.arm("step-timeout/r2", START.plus(Duration.ofMinutes(10)));
        timers.cancel("step-timeout/r2");

        assertThat(armed).containsExactly(Map.entry("approval-expiry/r1", WALL.plusSeconds(30)));
        assertThat(scale.wallTimeOf(START.minusSeconds(60))).isEqualTo(WALL.minusSeconds(1));
    }

    @Test
    void realTimeIsTheWallClockAndLeavesTimersAlone() {
        TimeScale real = TimeScale.real();
        Timers none = new Timers() {
            @Override
            public void arm(String key, Instant due) {
            }

            @Override
            public void cancel(String key) {
            }
        };
        assertThat(real.isReal()).isTrue();
        assertThat(real.factor()).isEqualTo(1);
        assertThat(real.wallTimeOf(START)).isEqualTo(START);
        assertThat(real.onProcessingTime(none)).isSameAs(none);
        assertThat(Duration.between(real.clock().instant(), Instant.now()).abs()).isLessThan(Duration.ofMinutes(1));
    }

    @ParameterizedTest
    @ValueSource(doubles = {0, 0.5, -3, 10_000.5, Double.NaN, Double.POSITIVE_INFINITY})
    void rejectsAFactorOutsideOneToTenThousand(double factor) {
        assertThatThrownBy(() -> TimeScale.accelerated(START, factor, WALL, nanos::get))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("time scale factor must be from 1 to 10000, got " + factor);
    }

    @Test
    void rejectsAMissingStart() {
        assertThatThrownBy(() -> TimeScale.accelerated(null, 10, WALL, nanos::get))
                .isInstanceOf(NullPointerException.class).hasMessage("start");
    }
}
