package dev.tend.shared.time;

import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The arithmetic calendar of {@link InstantText#write} writes every instant as java.time's
 * {@code Instant.toString()} does (ISO-8601 in the proleptic Gregorian calendar, java.time's own
 * date arithmetic as the outside reference).
 */
class InstantTextWriteTest {
    @Test
    void writesTheTextInstantTextWritesAcrossTheYearsAndFractions() {
        char[] buf = new char[InstantText.MAX];
        SplittableRandom random = new SplittableRandom(11);
        long first = Instant.parse("0000-01-01T00:00:00Z").getEpochSecond();
        long last = Instant.parse("9999-12-31T23:59:59Z").getEpochSecond();
        for (int i = 0; i < 200_000; i++) {
            long sec = random.nextLong(first, last + 1);
            int nano = switch (i % 4) {
                case 0 -> 0;
                case 1 -> random.nextInt(1000) * 1_000_000;
                case 2 -> random.nextInt(1_000_000) * 1000;
                default -> random.nextInt(1_000_000_000);
            };
            Instant t = Instant.ofEpochSecond(sec, nano);
            int n = InstantText.write(t, buf);
            assertThat(new String(buf, 0, n)).as("%s", t).isEqualTo(t.toString());
            assertThat(InstantText.of(t)).isEqualTo(t.toString());
            char[] fromNumbers = new char[InstantText.MAX];
            int m = InstantText.write(sec, nano, fromNumbers);
            assertThat(new String(fromNumbers, 0, m)).as("%s from its numbers", t).isEqualTo(t.toString());
        }
    }

    @Test
    void writesTheEdgesOfMonthsLeapDaysAndTheRange() {
        char[] buf = new char[InstantText.MAX];
        for (String s : new String[]{"1970-01-01T00:00:00Z", "1969-12-31T23:59:59.999999999Z", "2000-02-29T12:00:00.5Z",
                "1900-02-28T23:59:59Z", "1900-03-01T00:00:00Z", "2024-02-29T23:59:59.000001Z", "2027-03-14T02:17:00Z",
                "0000-01-01T00:00:00Z", "9999-12-31T23:59:59.999999999Z", "2100-03-01T00:00:00Z"}) {
            Instant t = Instant.parse(s);
            int n = InstantText.write(t, buf);
            assertThat(new String(buf, 0, n)).isEqualTo(t.toString());
        }
    }

    @Test
    void leavesYearsOutsideFourDigitsToToString() {
        char[] buf = new char[InstantText.MAX];
        assertThat(InstantText.write(Instant.parse("+10000-01-01T00:00:00Z"), buf)).isEqualTo(-1);
        assertThat(InstantText.write(Instant.parse("-0001-12-31T23:59:59Z"), buf)).isEqualTo(-1);
        assertThat(InstantText.of(Instant.parse("+10000-01-01T00:00:00Z"))).isEqualTo("+10000-01-01T00:00:00Z");
    }
}
