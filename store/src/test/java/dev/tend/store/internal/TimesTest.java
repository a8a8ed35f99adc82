package dev.tend.store.internal;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class TimesTest {
    @ParameterizedTest
    @ValueSource(strings = {"2027-03-14T02:17:00Z", "2027-03-14T02:17:00.123456789Z", "1969-12-31T23:59:59.999999999Z",
            "1970-01-01T00:00:00Z", "1677-09-21T00:12:43.145224192Z", "2262-04-11T23:47:16.854775807Z"})
    void instantsSurviveTheRoundTripToTheNanosecond(String text) {
        Instant t = Instant.parse(text);
        assertThat(Times.fromNanos(Times.toNanos(t, "t"))).isEqualTo(t);
    }

    @ParameterizedTest
    @ValueSource(strings = {"2262-04-11T23:47:16.854775808Z", "1677-09-21T00:12:43.145224191Z", "+10000-01-01T00:00:00Z"})
    void instantsOutsideTheKeptRangeAreRejectedNamingTheField(String text) {
        assertThatThrownBy(() -> Times.toNanos(Instant.parse(text), "RunRow.createdAt"))
                .isExactlyInstanceOf(IllegalArgumentException.class)
                .hasMessage("RunRow.createdAt " + Instant.parse(text) + " is outside the times the store can keep "
                        + "(1677-09-21 to 2262-04-11 UTC)");
    }

    // RFC 3339 section 5.6: time-secfrac is optional; ISO_INSTANT writes it in groups of three digits, only when not zero.
    @ParameterizedTest
    @CsvSource({"2027-03-14T02:17:00Z, 2027-03-14T02:17:00Z", "2027-03-14T02:17:00.5Z, 2027-03-14T02:17:00.500Z",
            "2027-03-14T02:17:00.000000001Z, 2027-03-14T02:17:00.000000001Z", "2027-03-14T03:17:00+01:00, 2027-03-14T02:17:00Z"})
    void ledgerTimesAreRfc3339InUtcWithFractionsOnlyWhenNotZero(String given, String written) {
        assertThat(LedgerChain.formatAt(java.time.OffsetDateTime.parse(given).toInstant())).isEqualTo(written);
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "jdbc:postgresql://db-1/tend?user=tend&password=hunter2|jdbc:postgresql://db-1/tend?user=tend&password=***",
            "jdbc:postgresql://db-1/tend?PASSWORD=a;b=c|jdbc:postgresql://db-1/tend?PASSWORD=***;b=c",
            "jdbc:postgresql://db-1/tend|jdbc:postgresql://db-1/tend"})
    void passwordsAreHiddenInUrlsShownToPeople(String url, String shown) {
        assertThat(Failures.redact(url)).isEqualTo(shown);
    }
}
