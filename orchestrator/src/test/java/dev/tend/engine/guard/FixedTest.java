package dev.tend.engine.guard;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Locale;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Objections write numbers as the JDK's Formatter (the reference here) writes {@code %.Nf}, without it. */
class FixedTest {
    @ParameterizedTest
    @ValueSource(doubles = {0, 0.5, 1.5, 2.5, 0.125, 0.005, 2.675, 1.005, 33.333333333333336, 66.66666666666667, 99.99999,
            12.5, 0.045, 1e-7, 1e20, 123456789.98765, -0.001, -0.5, -2.5, -12.345, 0.34, 0.3, 1.0 / 3})
    void writesWhatTheFormatterWrites(double x) {
        for (int places = 0; places <= 3; places++) {
            assertThat(Fixed.of(x, places)).as("%s with %d places", x, places)
                    .isEqualTo(String.format(Locale.ROOT, "%." + places + "f", x));
        }
    }

    @Test
    void writesWhatTheFormatterWritesForSharesOfClusters() {
        // what the blast-radius guard writes: impaired nodes over cluster sizes, as percentages, and fractions
        for (int size = 1; size <= 200; size++) {
            for (int impaired = 0; impaired <= size; impaired++) {
                double share = (double) impaired / size * 100;
                assertThat(Fixed.of(share, 0)).isEqualTo(String.format(Locale.ROOT, "%.0f", share));
            }
        }
        Random random = new Random(42);
        for (int i = 0; i < 20_000; i++) {
            double x = random.nextInt(4) == 0 ? random.nextInt(10_000) / 1000.0 : random.nextDouble() * Math.pow(10, random.nextInt(8) - 3);
            assertThat(Fixed.of(x, 2)).as("%s", x).isEqualTo(String.format(Locale.ROOT, "%.2f", x));
        }
    }

    @Test
    void refusesWhatIsNotANumber() {
        assertThatThrownBy(() -> Fixed.of(Double.NaN, 2)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> Fixed.of(Double.POSITIVE_INFINITY, 0)).isInstanceOf(IllegalArgumentException.class);
    }
}
