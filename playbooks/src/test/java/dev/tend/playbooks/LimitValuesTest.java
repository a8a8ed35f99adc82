package dev.tend.playbooks;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.time.Duration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Rate, loop and flapping limits, limits, and the impaired share, table by table. */
class LimitValuesTest {
    @ParameterizedTest(name = "rate {0} is {1} per {2}s")
    @CsvSource({"10/1h, 10, 3600", "1/30s, 1, 30", "50/1d, 50, 86400", "3/1h30m, 3, 5400"})
    void rateParsesCountSlashDuration(String text, int count, long seconds) {
        RateLimit r = RateLimit.parse(text);
        assertThat(r).isEqualTo(new RateLimit(count, Duration.ofSeconds(seconds)));
        assertThat(RateLimit.parse(r.toString())).isEqualTo(r);
    }

    @ParameterizedTest(name = "rate ''{0}'' is rejected: {1}")
    @CsvSource(delimiter = '|', value = {
            "10 per hour | a rate looks like 10/1h (a count, a slash, then a duration such as 30m, 1h or 1d), got '10 per hour'",
            "10/hour     | a rate looks like 10/1h (a count, a slash, then a duration such as 30m, 1h or 1d), got '10/hour' (a duration looks like 30s, 5m, 6h or 1d, got 'hour')",
            "/1h         | a rate looks like 10/1h (a count, a slash, then a duration such as 30m, 1h or 1d), got '/1h'",
            "0/1h        | rate count must be at least 1, got 0",
            "10/0s       | rate period must be longer than zero, got PT0S",
    })
    void rateRejectsOtherForms(String text, String message) {
        assertThatThrownBy(() -> RateLimit.parse(text)).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }

    @Test
    void loopAndFlappingHaveTheirOwnExplanations() {
        assertThat(LoopLimit.parse("3/24h")).isEqualTo(new LoopLimit(3, Duration.ofHours(24)));
        assertThat(FlapLimit.parse("4/10m")).isEqualTo(new FlapLimit(4, Duration.ofMinutes(10)));
        assertThatThrownBy(() -> LoopLimit.parse("three a day")).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a loop limit looks like 3/24h (at most 3 runs on one target within 24h), got 'three a day'");
        assertThatThrownBy(() -> FlapLimit.parse("4 in 10m")).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a flapping limit looks like 4/10m (more than 4 state changes within 10m), got '4 in 10m'");
    }

    @ParameterizedTest(name = "{0} changes against 4/10m: flapping {1}")
    @CsvSource({"3, false", "4, false", "5, true"})
    void flappingMeansMoreThanTheCount(int changes, boolean flapping) {
        assertThat(FlapLimit.parse("4/10m").isFlapping(changes)).isEqualTo(flapping);
    }

    @Test
    void limitsRejectValuesOutsideTheirRange() {
        assertThatThrownBy(() -> Limits.builder().perCluster(0).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.per-cluster must be at least 1, got 0");
        assertThatThrownBy(() -> Limits.builder().fleet(-1).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.fleet must be at least 1, got -1");
        assertThatThrownBy(() -> Limits.builder().perZone(0).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.per-zone must be at least 1, got 0");
        assertThatThrownBy(() -> Limits.builder().impairedFraction(0.0).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.impaired-fraction must be more than 0 and at most 1, got 0.0");
        assertThatThrownBy(() -> Limits.builder().impairedFraction(1.5).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.impaired-fraction must be more than 0 and at most 1, got 1.5");
        assertThatThrownBy(() -> Limits.builder().cooldown(Duration.ofMinutes(-1)).build()).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("limits.cooldown must not be negative, got PT-1M");
    }

    @Test
    void effectiveLimitsTakeEverySetFieldAndKeepTheRest() {
        Limits some = Limits.builder().fleet(3).keepQuorum(false).flapping(FlapLimit.parse("2/5m")).build();

        EffectiveLimits e = EffectiveLimits.builtIn().withOverrides(some);

        assertThat(e).isEqualTo(new EffectiveLimits(1, 3, 5, RateLimit.parse("20/1h"), Duration.ofHours(1), LoopLimit.parse("3/24h"),
                0.34, false, true, FlapLimit.parse("2/5m")));
        assertThat(EffectiveLimits.builtIn().withOverrides(Limits.none())).isEqualTo(EffectiveLimits.builtIn());
    }

    @ParameterizedTest(name = "impaired-fraction {0} of {1} nodes allows {2}")
    @CsvSource({"0.34, 3, 1", "0.34, 6, 2", "0.67, 3, 2", "0.3, 10, 3", "0.29, 100, 29", "1, 5, 5", "0.25, 3, 0"})
    void impairedShareIsTheFloorInDecimal(double fraction, int nodes, int allowed) {
        assertThat(ImpairedShare.allowed(fraction, nodes)).isEqualTo(allowed);
    }
}
