package dev.tend.shared.time;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Instant;
import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;

/** Checked against java.time's own {@code Instant.toString()} (ISO-8601, as the JDK writes it), a reference library. */
class InstantTextTest {
    @ParameterizedTest
    @ValueSource(strings = {"2027-03-14T02:17:05Z", "2027-03-14T02:17:05.999Z", "2027-03-14T02:17:05.000000001Z"})
    void toTheSecondDropsTheFraction(String text) {
        assertThat(InstantText.toSecond(Instant.parse(text))).isEqualTo("2027-03-14T02:17:05Z");
    }

    @ParameterizedTest
    @ValueSource(strings = {"2027-03-14T02:17:00Z", "2027-03-14T02:17:00.500Z", "2027-03-14T02:17:00.000001Z",
            "2027-03-14T02:17:00.000000001Z", "2027-03-14T02:17:00.120Z", "2027-03-14T02:17:00.123456789Z", "1970-01-01T00:00:00Z",
            "1969-12-31T23:59:59.999Z", "0000-01-01T00:00:00Z", "9999-12-31T23:59:59.999999999Z", "2028-02-29T12:00:00Z",
            "+10000-01-01T00:00:00Z", "-0001-12-31T23:59:59Z"})
    void writesWhatInstantToStringWrites(String text) {
        Instant t = Instant.parse(text);
        assertThat(InstantText.of(t)).isEqualTo(t.toString());
    }

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3})
    void agreesWithInstantToStringOnRandomInstants(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        for (int i = 0; i < 20_000; i++) {
            Instant t = Instant.ofEpochSecond(r.nextLong(-62_000_000_000L, 253_000_000_000L),
                    switch (i % 4) {
                        case 0 -> 0;
                        case 1 -> r.nextInt(1000) * 1_000_000;
                        case 2 -> r.nextInt(1_000_000) * 1000;
                        default -> r.nextInt(1_000_000_000);
                    });
            assertThat(InstantText.of(t)).isEqualTo(t.toString());
        }
    }
}
