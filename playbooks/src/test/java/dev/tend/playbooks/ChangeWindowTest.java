package dev.tend.playbooks;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Change windows against java.time's tz database. Clock changes used:
 * Europe/Berlin follows the EU summer-time rule (Directive 2000/84/EC): clocks go forward at
 * 01:00 UTC on the last Sunday of March (28 March 2027: 02:00 CET becomes 03:00 CEST) and back
 * at 01:00 UTC on the last Sunday of October (31 October 2027: 03:00 CEST becomes 02:00 CET).
 * America/New_York follows the US Energy Policy Act of 2005: forward at 02:00 local time on the
 * second Sunday of March (14 March 2027: 02:00 EST becomes 03:00 EDT, at 07:00 UTC).
 */
class ChangeWindowTest {
    private static final ZoneId BERLIN = ZoneId.of("Europe/Berlin");
    private static final ZoneId NEW_YORK = ZoneId.of("America/New_York");

    private static ChangeWindow window(String cron, ZoneId zone, String length) {
        return ChangeWindow.of(cron, zone, dev.tend.shared.time.Durations.parse(length));
    }

    private static Instant t(String utc) {
        return Instant.parse(utc);
    }

    @ParameterizedTest(name = "Berlin daily 01:00 for 4h: next opening after {0} is {1}")
    @CsvSource({
            "2027-03-27T12:00:00Z, 2027-03-28T00:00:00Z",   // 28 March 01:00 is still CET (+01:00)
            "2027-03-28T04:00:00Z, 2027-03-28T23:00:00Z",   // 29 March 01:00 is CEST (+02:00)
            "2027-03-26T23:00:00Z, 2027-03-27T00:00:00Z",   // the day before the change
    })
    void berlinNightWindowOpensAtLocalOneAcrossTheMarchChange(String from, String expected) {
        ChangeWindow w = window("0 0 1 * * ?", BERLIN, "4h");
        assertThat(w.nextOpening(t(from))).isEqualTo(t(expected));
    }

    @ParameterizedTest(name = "Berlin daily 01:00 for 4h is open at {0}: {1}")
    @CsvSource({
            "2027-03-27T23:59:59Z, false",
            "2027-03-28T00:00:00Z, true",    // the opening itself
            "2027-03-28T03:59:59Z, true",    // 4h of elapsed time: the last second, 05:59:59 CEST
            "2027-03-28T04:00:00Z, false",   // the end is exclusive
            "2027-03-28T22:59:59Z, false",
            "2027-03-28T23:00:00Z, true",    // 29 March 01:00 CEST
            "2027-03-29T02:59:59Z, true",
            "2027-03-29T03:00:00Z, false",   // 05:00 CEST
    })
    void berlinNightWindowEdgesAcrossTheMarchChange(String at, boolean open) {
        assertThat(window("0 0 1 * * ?", BERLIN, "4h").isOpen(t(at))).isEqualTo(open);
    }

    @Test
    void berlinOpeningInTheSkippedHourMovesForwardByTheGapInsteadOfSkippingTheDay() {
        ChangeWindow w = window("0 30 2 * * ?", BERLIN, "1h");

        assertThat(w.nextOpening(t("2027-03-27T00:00:00Z"))).isEqualTo(t("2027-03-27T01:30:00Z")); // 02:30 CET
        assertThat(w.nextOpening(t("2027-03-27T03:00:00Z"))).isEqualTo(t("2027-03-28T01:30:00Z")); // 02:30 does not exist: 03:30 CEST
        assertThat(w.nextOpening(t("2027-03-28T03:00:00Z"))).isEqualTo(t("2027-03-29T00:30:00Z")); // 02:30 CEST
        assertThat(w.isOpen(t("2027-03-28T02:29:59Z"))).isTrue();
        assertThat(w.isOpen(t("2027-03-28T02:30:00Z"))).isFalse();
    }

    @Test
    void berlinOpeningInTheRepeatedHourOpensAtBothInstants() {
        ChangeWindow w = window("0 30 2 * * ?", BERLIN, "15m");

        assertThat(w.nextOpening(t("2027-10-31T00:00:00Z"))).isEqualTo(t("2027-10-31T00:30:00Z")); // 02:30 CEST
        assertThat(w.isOpen(t("2027-10-31T00:44:59Z"))).isTrue();
        assertThat(w.isOpen(t("2027-10-31T00:45:00Z"))).isFalse();
        assertThat(w.nextOpening(t("2027-10-31T00:45:00Z"))).isEqualTo(t("2027-10-31T01:30:00Z")); // 02:30 CET
        assertThat(w.nextOpening(t("2027-10-31T01:45:00Z"))).isEqualTo(t("2027-11-01T01:30:00Z"));
    }

    @Test
    void halfHourlyOpeningsKeepEveryRealHalfHourThroughTheRepeatedHour() {
        ChangeWindow w = window("0 0/30 * * * ?", BERLIN, "1m");

        Instant at = t("2027-10-31T00:00:00Z"); // 02:00 CEST
        java.util.List<Instant> openings = new java.util.ArrayList<>();
        for (int i = 0; i < 4; i++) {
            at = w.nextFireAfter(at);
            openings.add(at);
        }
        // 02:30 CEST, 02:00 CET, 02:30 CET, 03:00 CET
        assertThat(openings).containsExactly(t("2027-10-31T00:30:00Z"), t("2027-10-31T01:00:00Z"), t("2027-10-31T01:30:00Z"),
                t("2027-10-31T02:00:00Z"));
    }

    @ParameterizedTest(name = "New York daily 01:00 for 4h: next opening after {0} is {1}")
    @CsvSource({
            "2027-03-13T12:00:00Z, 2027-03-14T06:00:00Z",   // 14 March 01:00 is still EST (-05:00)
            "2027-03-14T10:00:00Z, 2027-03-15T05:00:00Z",   // 15 March 01:00 is EDT (-04:00)
    })
    void newYorkNightWindowOpensAtLocalOneAcrossTheMarchChange(String from, String expected) {
        assertThat(window("0 0 1 * * ?", NEW_YORK, "4h").nextOpening(t(from))).isEqualTo(t(expected));
    }

    @ParameterizedTest(name = "New York daily 01:00 for 4h is open at {0}: {1}")
    @CsvSource({
            "2027-03-14T05:59:59Z, false",
            "2027-03-14T06:00:00Z, true",
            "2027-03-14T09:59:59Z, true",    // 05:59:59 EDT: the clocks jumped at 07:00 UTC, the length did not change
            "2027-03-14T10:00:00Z, false",
            "2027-03-15T05:00:00Z, true",
            "2027-03-15T09:00:00Z, false",
    })
    void newYorkNightWindowEdgesAcrossTheMarchChange(String at, boolean open) {
        assertThat(window("0 0 1 * * ?", NEW_YORK, "4h").isOpen(t(at))).isEqualTo(open);
    }

    @Test
    void newYorkOpeningInTheSkippedHourMovesForwardByTheGap() {
        ChangeWindow w = window("0 30 2 * * ?", NEW_YORK, "30m");

        assertThat(w.nextOpening(t("2027-03-13T12:00:00Z"))).isEqualTo(t("2027-03-14T07:30:00Z")); // 03:30 EDT
        assertThat(w.nextOpening(t("2027-03-14T08:00:00Z"))).isEqualTo(t("2027-03-15T06:30:00Z")); // 02:30 EDT
    }

    @Test
    void weekdayWindowSkipsTheWeekendAcrossTheChange() {
        ChangeWindow w = window("0 0 1 ? * MON-FRI", BERLIN, "4h");

        // Friday 26 March after its window: the next is Monday 29 March 01:00 CEST
        assertThat(w.nextOpening(t("2027-03-26T05:00:00Z"))).isEqualTo(t("2027-03-28T23:00:00Z"));
        assertThat(w.isOpen(t("2027-03-28T00:00:00Z"))).as("Sunday").isFalse();
    }

    @Test
    void repeatedFiringsMergeIntoOneLongerOpening() {
        ChangeWindow w = window("0 0 1-5 ? * MON-FRI", BERLIN, "4h");

        assertThat(w.isOpen(t("2027-03-24T07:59:59Z"))).as("08:59:59 CET").isTrue();
        assertThat(w.isOpen(t("2027-03-24T08:00:00Z"))).as("09:00 CET").isFalse();
    }

    @Test
    void nextOpeningIsTheInstantItselfWhenOpen() {
        Instant inside = t("2027-03-28T01:00:00Z");
        assertThat(window("0 0 1 * * ?", BERLIN, "4h").nextOpening(inside)).isEqualTo(inside);
    }

    @Test
    void calendarThatDoesNotExistNeverOpens() {
        assertThat(window("0 0 0 30 2 ?", BERLIN, "1h").nextOpening(Instant.EPOCH)).isNull();
    }

    @Test
    void zeroLengthIsRejected() {
        assertThatThrownBy(() -> ChangeWindow.of("0 0 1 * * ?", BERLIN, Duration.ZERO))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("window.length must be longer than zero, got PT0S");
    }

    @Test
    void cronQuartzRejectsIsRejectedWithQuartzReason() {
        assertThatThrownBy(() -> ChangeWindow.of("0 0 25 * * ?", BERLIN, Duration.ofHours(1)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("Quartz rejects the cron expression '0 0 25 * * ?': Hour values must be between 0 and 23"
                        + " (fields: seconds minutes hours day-of-month month day-of-week [year])");
    }
}
