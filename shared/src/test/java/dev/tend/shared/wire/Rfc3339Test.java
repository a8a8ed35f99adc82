package dev.tend.shared.wire;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class Rfc3339Test {

    // RFC 3339 section 5.8 examples; the leap-second ones read as 23:59:59.999999999 UTC (see Rfc3339's javadoc)
    @ParameterizedTest(name = "{0}")
    @CsvSource({
            "1985-04-12T23:20:50.52Z,      1985-04-12T23:20:50.520Z",
            "1996-12-19T16:39:57-08:00,    1996-12-20T00:39:57Z",
            "1990-12-31T23:59:60Z,         1990-12-31T23:59:59.999999999Z",
            "1990-12-31T15:59:60-08:00,    1990-12-31T23:59:59.999999999Z",
            "1937-01-01T12:00:27.87+00:20, 1937-01-01T11:40:27.870Z",
    })
    void readsTheExamplesOfRfc3339Section5_8(String text, String expectedUtc) {
        assertThat(Rfc3339.parse(text)).isEqualTo(Instant.parse(expectedUtc));
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({
            "2027-03-14T02:17:00Z,                2027-03-14T02:17:00Z",
            "2027-03-14t02:17:00z,                2027-03-14T02:17:00Z",
            "2027-03-14T03:17:00+01:00,           2027-03-14T02:17:00Z",
            "2027-03-14T02:17:00-00:00,           2027-03-14T02:17:00Z",
            "2027-03-14T02:17:00.5Z,              2027-03-14T02:17:00.500Z",
            "2027-03-14T02:17:00.123456789Z,      2027-03-14T02:17:00.123456789Z",
            "2027-03-14T23:30:00-05:30,           2027-03-15T05:00:00Z",
            "2028-02-29T00:00:00Z,                2028-02-29T00:00:00Z",
            "2000-02-29T12:00:00Z,                2000-02-29T12:00:00Z",
            "0000-01-01T00:00:00Z,                0000-01-01T00:00:00Z",
            "9999-12-31T23:59:59.999999999Z,      9999-12-31T23:59:59.999999999Z",
            "2027-06-30T23:59:60.25Z,             2027-06-30T23:59:59.999999999Z",
    })
    void readsEveryOffsetFractionAndLetterCase(String text, String expectedUtc) {
        assertThat(Rfc3339.parse(text)).isEqualTo(Instant.parse(expectedUtc));
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', quoteCharacter = '"', value = {
            "2027-03-14 02:17|'2027-03-14 02:17' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)",
            "2027-03-14T02:17:00|'2027-03-14T02:17:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): it has no zone; add Z for UTC or an offset like +01:00",
            "2027-03-14T02:17:00.5|'2027-03-14T02:17:00.5' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): it has no zone; add Z for UTC or an offset like +01:00",
            "2027-03-14 02:17:00Z|'2027-03-14 02:17:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): separate the date and the time with T",
            "2027-03-14T02:17Z|'2027-03-14T02:17Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)",
            "yesterday|'yesterday' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)",
            "1710382620|'1710382620' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)",
            "2027-13-01T00:00:00Z|'2027-13-01T00:00:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the month must be 01 to 12",
            "2027-02-29T00:00:00Z|'2027-02-29T00:00:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the day must be 01 to 28 in 2027-02",
            "2027-04-31T00:00:00Z|'2027-04-31T00:00:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the day must be 01 to 30 in 2027-04",
            "2027-03-14T24:00:00Z|'2027-03-14T24:00:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the hour must be 00 to 23",
            "2027-03-14T02:60:00Z|'2027-03-14T02:60:00Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the minute must be 00 to 59",
            "2027-03-14T02:17:61Z|'2027-03-14T02:17:61Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the second must be 00 to 59 (60 only for a leap second)",
            "2027-03-14T02:17:60Z|'2027-03-14T02:17:60Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): a leap second (second 60) can only be 23:59:60 UTC on the last day of a month",
            "2027-06-30T23:59:60+01:00|'2027-06-30T23:59:60+01:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): a leap second (second 60) can only be 23:59:60 UTC on the last day of a month",
            "2027-03-14T02:17:00.Z|'2027-03-14T02:17:00.Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): a '.' must be followed by the fraction's digits",
            "2027-03-14T02:17:00.1234567891Z|'2027-03-14T02:17:00.1234567891Z' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): it has 10 fraction digits; at most 9 (nanoseconds) are kept",
            "2027-03-14T02:17:00+0100|'2027-03-14T02:17:00+0100' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the zone must be Z or an offset like +01:00 or -08:00",
            "2027-03-14T02:17:00+24:00|'2027-03-14T02:17:00+24:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the offset's hours must be 00 to 23",
            "2027-03-14T02:17:00+01:60|'2027-03-14T02:17:00+01:60' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the offset's minutes must be 00 to 59",
            "2027-03-14T02:17:00ZZ|'2027-03-14T02:17:00ZZ' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z)",
            "0000-01-01T00:30:00+01:00|'0000-01-01T00:30:00+01:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): in UTC it falls outside the years 0000 to 9999",
            "9999-12-31T23:30:00-01:00|'9999-12-31T23:30:00-01:00' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): in UTC it falls outside the years 0000 to 9999",
            "2027-03-14T02:17:00UTC|'2027-03-14T02:17:00UTC' is not an RFC 3339 time with a zone (like 2027-03-14T02:17:00Z): the zone must be Z or an offset like +01:00 or -08:00",
    })
    void rejectsWhatIsNotAnRfc3339TimeWithAZone(String text, String message) {
        assertThatThrownBy(() -> Rfc3339.parse(text))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage(message);
    }

    @Test
    void rejectsNullWithAnExample() {
        assertThatThrownBy(() -> Rfc3339.parse(null))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a time is required, like 2027-03-14T02:17:00Z");
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({
            "2027-03-14T02:17:00Z,           2027-03-14T02:17:00Z",
            "2027-03-14T02:17:00.500Z,       2027-03-14T02:17:00.5Z",
            "1985-04-12T23:20:50.520Z,       1985-04-12T23:20:50.52Z",
            "2027-03-14T02:17:00.000000001Z, 2027-03-14T02:17:00.000000001Z",
            "2027-03-14T02:17:00.120000Z,    2027-03-14T02:17:00.12Z",
            "1969-12-31T23:59:59.9Z,         1969-12-31T23:59:59.9Z",
            "0000-01-01T00:00:00Z,           0000-01-01T00:00:00Z",
    })
    void formatsUtcWithZAndAFractionOnlyWhenPresent(String instant, String expected) {
        assertThat(Rfc3339.format(Instant.parse(instant))).isEqualTo(expected);
    }

    @Test
    void knowsTheFirstAndLastSecondItCanWrite() {
        assertThat(Rfc3339.parse("0000-01-01T00:00:00Z")).isEqualTo(Instant.parse("0000-01-01T00:00:00Z"));
        assertThat(Rfc3339.parse("9999-12-31T23:59:59Z")).isEqualTo(Instant.parse("9999-12-31T23:59:59Z"));
    }

    @Test
    void refusesToFormatYearsRfc3339CannotWrite() {
        assertThatThrownBy(() -> Rfc3339.format(Instant.parse("+10000-01-01T00:00:00Z")))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("RFC 3339 writes years 0000 to 9999 only, got +10000-01-01T00:00:00Z");
        assertThatThrownBy(() -> Rfc3339.format(Instant.parse("-0001-12-31T23:59:59Z")))
                .isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void countsDaysAsJavaTimeDoesOnEveryDayOfTwoCenturiesAndAroundEveryLeapDay() {
        List<String> wrong = new ArrayList<>();
        for (LocalDate d = LocalDate.of(1900, 1, 1); d.getYear() < 2100; d = d.plusDays(1)) {
            check(d, wrong);
        }
        for (int year = 0; year <= 9999; year++) {
            for (int k = 0; k < 3; k++) check(LocalDate.of(year, 2, 28).plusDays(k), wrong);
        }
        assertThat(wrong).isEmpty();
    }

    private static void check(LocalDate d, List<String> wrong) {
        String text = String.format("%04d-%02d-%02dT12:00:00Z", d.getYear(), d.getMonthValue(), d.getDayOfMonth());
        if (!Rfc3339.parse(text).equals(d.atTime(12, 0).toInstant(ZoneOffset.UTC))) wrong.add(text);
    }

    @Test
    void readsBackEveryInstantItFormats() {
        Random random = new Random(7);
        long min = Instant.parse("0000-01-01T00:00:00Z").getEpochSecond();
        long max = Instant.parse("9999-12-31T23:59:59Z").getEpochSecond();
        for (int i = 0; i < 20_000; i++) {
            long second = min + (long) (random.nextDouble() * (max - min));
            int nano = switch (i % 4) {
                case 0 -> 0;
                case 1 -> random.nextInt(1000) * 1_000_000;
                case 2 -> random.nextInt(1_000_000) * 1_000;
                default -> random.nextInt(1_000_000_000);
            };
            Instant t = Instant.ofEpochSecond(second, nano);
            String text = Rfc3339.format(t);
            assertThat(Rfc3339.parse(text)).as(text).isEqualTo(t);
            assertThat(Instant.parse(text)).as("java.time reads %s the same way", text).isEqualTo(t);
        }
    }
}
