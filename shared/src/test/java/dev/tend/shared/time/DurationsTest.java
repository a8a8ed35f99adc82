package dev.tend.shared.time;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Duration;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class DurationsTest {
    @ParameterizedTest(name = "{0}")
    @CsvSource({
            "30s,    PT30S",
            "90s,    PT1M30S",
            "5m,     PT5M",
            "6h,     PT6H",
            "1d,     PT24H",
            "7d,     PT168H",
            "1h30m,  PT1H30M",
            "1d2h3m4s, PT26H3M4S",
            "0s,     PT0S",
            "30m30m, PT1H",
    })
    void readsTheCompactForm(String text, String expected) {
        assertThat(Durations.parse(text)).isEqualTo(Duration.parse(expected));
    }

    @ParameterizedTest(name = "''{0}''")
    @ValueSource(strings = {"5 minutes", "5", "m5", "-5m", "1.5h", "5M", "5min", "PT5M", " 5m", "5m ", "", "1w"})
    void rejectsEverythingElseShowingTheForm(String text) {
        assertThatThrownBy(() -> Durations.parse(text))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a duration looks like 30s, 5m, 6h or 1d, got '" + text + "'");
    }

    @ParameterizedTest(name = "''{0}''")
    @ValueSource(strings = {"99999999999999999999s", "106751991167301d", "100000d", "3651d", "3650d1s"})
    void rejectsDurationsTooLongToHold(String text) {
        assertThatThrownBy(() -> Durations.parse(text))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a duration is at most 3650d (ten years), got '" + text + "'");
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({"PT30S, 30s", "PT1M30S, 1m30s", "PT6H, 6h", "PT24H, 1d", "PT26H3M4S, 1d2h3m4s", "PT0S, 0s"})
    void formatsWhatItReads(String duration, String expected) {
        Duration d = Duration.parse(duration);
        assertThat(Durations.format(d)).isEqualTo(expected);
        assertThat(Durations.parse(Durations.format(d))).isEqualTo(d);
    }
}
