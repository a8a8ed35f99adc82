package dev.tend.playbooks;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.time.DayOfWeek;
import java.time.Instant;
import java.time.LocalTime;
import java.time.ZoneId;
import java.util.EnumSet;
import java.util.Set;

import static java.time.DayOfWeek.FRIDAY;
import static java.time.DayOfWeek.MONDAY;
import static java.time.DayOfWeek.SATURDAY;
import static java.time.DayOfWeek.SUNDAY;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Change windows against java.time's tz database. The expected instants are worked out by
 * hand from the laws that set the clock changes:
 * <ul>
 *   <li>Europe/Berlin follows the EU summer-time rule (Directive 2000/84/EC, articles 2 and 3):
 *       summer time begins at 01:00 UTC on the last Sunday of March (28 March 2027: 02:00 CET
 *       becomes 03:00 CEST) and ends at 01:00 UTC on the last Sunday of October (31 October
 *       2027: 03:00 CEST becomes 02:00 CET, so 02:00-03:00 happens twice).</li>
 *   <li>America/New_York follows the US Energy Policy Act of 2005, section 110, amending
 *       15 U.S.C. 260a: daylight time begins at 02:00 local time on the second Sunday of March
 *       (14 March 2027: 02:00 EST becomes 03:00 EDT, at 07:00 UTC) and ends at 02:00 local time
 *       on the first Sunday of November (7 November 2027: 02:00 EDT becomes 01:00 EST, at
 *       06:00 UTC, so 01:00-02:00 happens twice).</li>
 * </ul>
 */
class ChangeWindowTest {
    private static final ZoneId BERLIN = ZoneId.of("Europe/Berlin");
    private static final ZoneId NEW_YORK = ZoneId.of("America/New_York");
    private static final ZoneId UTC = ZoneId.of("UTC");

    private static ChangeWindow daily(String from, String until, ZoneId zone) {
        return new ChangeWindow(ChangeWindow.everyDay(), LocalTime.parse(from), LocalTime.parse(until), zone);
    }

    private static Instant t(String utc) {
        return Instant.parse(utc);
    }

    @ParameterizedTest(name = "Berlin daily 01:00-05:00 is open at {0}: {1}")
    @CsvSource({
            "2027-03-27T23:59:59Z, false",   // 00:59:59 CET on 28 March
            "2027-03-28T00:00:00Z, true",    // 01:00 CET: opens
            "2027-03-28T00:59:59Z, true",    // 01:59:59 CET, the last second before the jump
            "2027-03-28T01:00:00Z, true",    // 03:00 CEST
            "2027-03-28T02:59:59Z, true",    // 04:59:59 CEST
            "2027-03-28T03:00:00Z, false",   // 05:00 CEST: closes, three hours after it opened
            "2027-03-28T23:00:00Z, true",    // 01:00 CEST on 29 March
            "2027-03-29T03:00:00Z, false",   // 05:00 CEST
    })
    void berlinWindowOpensAndClosesAtTheWrittenClockTimesOnTheSpringForwardNight(String at, boolean open) {
        assertThat(daily("01:00", "05:00", BERLIN).isOpen(t(at))).isEqualTo(open);
    }

    @ParameterizedTest(name = "Berlin daily 01:00-05:00 is open at {0}: {1}")
    @CsvSource({
            "2027-10-30T22:59:59Z, false",   // 00:59:59 CEST on 31 October
            "2027-10-30T23:00:00Z, true",    // 01:00 CEST: opens
            "2027-10-31T00:59:59Z, true",    // 02:59:59 CEST, just before the clocks go back
            "2027-10-31T01:00:00Z, true",    // 02:00 CET, the repeated hour
            "2027-10-31T03:59:59Z, true",    // 04:59:59 CET
            "2027-10-31T04:00:00Z, false",   // 05:00 CET: closes, five hours after it opened
    })
    void berlinWindowLastsAnHourLongerOnTheFallBackNight(String at, boolean open) {
        assertThat(daily("01:00", "05:00", BERLIN).isOpen(t(at))).isEqualTo(open);
    }

    @Test
    void berlinOpeningInTheSkippedHourMovesForwardByTheGap() {
        ChangeWindow w = daily("02:30", "04:00", BERLIN);

        assertThat(w.nextOpening(t("2027-03-27T03:00:00Z"))).isEqualTo(t("2027-03-28T01:30:00Z")); // 02:30 does not exist: 03:30 CEST
        assertThat(w.isOpen(t("2027-03-28T01:59:59Z"))).isTrue();
        assertThat(w.isOpen(t("2027-03-28T02:00:00Z"))).as("04:00 CEST").isFalse();
        assertThat(w.nextOpening(t("2027-03-28T02:00:00Z"))).isEqualTo(t("2027-03-29T00:30:00Z")); // 02:30 CEST
    }

    @Test
    void berlinWindowPushedPastItsClosingBySpringForwardSkipsThatDayOnly() {
        ChangeWindow w = daily("02:30", "03:00", BERLIN);

        // 28 March: 02:30 becomes 03:30 CEST, after 03:00 CEST; the next opening is 29 March 02:30 CEST
        assertThat(w.nextOpening(t("2027-03-27T23:00:00Z"))).isEqualTo(t("2027-03-29T00:30:00Z"));
        assertThat(w.isOpen(t("2027-03-28T01:15:00Z"))).isFalse();
    }

    @Test
    void berlinOpeningInTheRepeatedHourTakesTheFirstOccurrence() {
        ChangeWindow w = daily("02:30", "03:30", BERLIN);

        assertThat(w.nextOpening(t("2027-10-30T22:00:00Z"))).isEqualTo(t("2027-10-31T00:30:00Z")); // 02:30 CEST
        assertThat(w.isOpen(t("2027-10-31T02:29:59Z"))).as("03:29:59 CET").isTrue();
        assertThat(w.isOpen(t("2027-10-31T02:30:00Z"))).as("03:30 CET").isFalse();
    }

    @ParameterizedTest(name = "New York daily 01:00-05:00 is open at {0}: {1}")
    @CsvSource({
            "2027-03-14T05:59:59Z, false",
            "2027-03-14T06:00:00Z, true",    // 01:00 EST: opens
            "2027-03-14T06:59:59Z, true",    // 01:59:59 EST
            "2027-03-14T07:00:00Z, true",    // 03:00 EDT
            "2027-03-14T08:59:59Z, true",    // 04:59:59 EDT
            "2027-03-14T09:00:00Z, false",   // 05:00 EDT: closes, three hours after it opened
            "2027-03-15T05:00:00Z, true",    // 01:00 EDT on 15 March
            "2027-03-15T09:00:00Z, false",
    })
    void newYorkWindowAcrossTheSpringForwardNight(String at, boolean open) {
        assertThat(daily("01:00", "05:00", NEW_YORK).isOpen(t(at))).isEqualTo(open);
    }

    @ParameterizedTest(name = "New York daily 01:00-05:00 is open at {0}: {1}")
    @CsvSource({
            "2027-11-07T04:59:59Z, false",
            "2027-11-07T05:00:00Z, true",    // 01:00 EDT, the first of the two 01:00s: opens
            "2027-11-07T06:00:00Z, true",    // 01:00 EST, the second
            "2027-11-07T09:59:59Z, true",    // 04:59:59 EST
            "2027-11-07T10:00:00Z, false",   // 05:00 EST: closes, five hours after it opened
    })
    void newYorkWindowAcrossTheFallBackNight(String at, boolean open) {
        assertThat(daily("01:00", "05:00", NEW_YORK).isOpen(t(at))).isEqualTo(open);
    }

    @Test
    void newYorkOpeningInTheSkippedHourMovesForwardByTheGap() {
        ChangeWindow w = daily("02:30", "04:00", NEW_YORK);

        assertThat(w.nextOpening(t("2027-03-13T12:00:00Z"))).isEqualTo(t("2027-03-14T07:30:00Z")); // 03:30 EDT
        assertThat(w.nextOpening(t("2027-03-14T08:00:00Z"))).isEqualTo(t("2027-03-15T06:30:00Z")); // 02:30 EDT
    }

    @Test
    void untilBeforeFromSpansMidnightAndBelongsToTheDayItOpens() {
        ChangeWindow w = new ChangeWindow(EnumSet.of(FRIDAY), LocalTime.of(22, 0), LocalTime.of(2, 0), UTC);

        assertThat(w.spansMidnight()).isTrue();
        assertThat(w.isOpen(t("2027-03-26T21:59:59Z"))).isFalse();
        assertThat(w.isOpen(t("2027-03-26T22:00:00Z"))).as("Friday 22:00").isTrue();
        assertThat(w.isOpen(t("2027-03-27T01:59:59Z"))).as("Saturday 01:59:59").isTrue();
        assertThat(w.isOpen(t("2027-03-27T02:00:00Z"))).isFalse();
        assertThat(w.isOpen(t("2027-03-27T22:00:00Z"))).as("Saturday is not a day of the window").isFalse();
        assertThat(w.nextOpening(t("2027-03-27T02:00:00Z"))).isEqualTo(t("2027-04-02T22:00:00Z"));
    }

    @Test
    void midnightSpanningWindowOverTheSpringForwardNightIsAnHourShorter() {
        ChangeWindow w = new ChangeWindow(EnumSet.of(SATURDAY), LocalTime.of(22, 0), LocalTime.of(4, 0), BERLIN);

        assertThat(w.opening(java.time.LocalDate.of(2027, 3, 27))).isEqualTo(t("2027-03-27T21:00:00Z")); // 22:00 CET
        assertThat(w.closing(java.time.LocalDate.of(2027, 3, 27))).isEqualTo(t("2027-03-28T02:00:00Z")); // 04:00 CEST
        assertThat(w.isOpen(t("2027-03-28T01:59:59Z"))).isTrue();
        assertThat(w.isOpen(t("2027-03-28T02:00:00Z"))).isFalse();
    }

    @Test
    void weekdayWindowSkipsTheWeekendAcrossTheChange() {
        ChangeWindow w = new ChangeWindow(ChangeWindow.parseDays("mon-fri"), LocalTime.of(1, 0), LocalTime.of(5, 0), BERLIN);

        // Friday 26 March after its window: the next is Monday 29 March 01:00 CEST
        assertThat(w.nextOpening(t("2027-03-26T05:00:00Z"))).isEqualTo(t("2027-03-28T23:00:00Z"));
        assertThat(w.isOpen(t("2027-03-28T00:00:00Z"))).as("Sunday").isFalse();
    }

    @Test
    void nextOpeningIsTheInstantItselfWhenOpen() {
        Instant inside = t("2027-03-28T01:00:00Z");
        assertThat(daily("01:00", "05:00", BERLIN).nextOpening(inside)).isEqualTo(inside);
    }

    @ParameterizedTest(name = "days ''{0}'' are {1}")
    @CsvSource(delimiter = ';', value = {
            "mon; MONDAY",
            "SUN; SUNDAY",
            "mon-fri; MONDAY TUESDAY WEDNESDAY THURSDAY FRIDAY",
            "fri-mon; MONDAY FRIDAY SATURDAY SUNDAY",
            "sat-sun; SATURDAY SUNDAY",
    })
    void dayNamesAndRangesParse(String text, String expected) {
        Set<DayOfWeek> want = EnumSet.noneOf(DayOfWeek.class);
        for (String d : expected.split(" ")) want.add(DayOfWeek.valueOf(d));
        assertThat(ChangeWindow.parseDays(text)).isEqualTo(want);
    }

    @Test
    void writtenFormIsTendsOwn() {
        ChangeWindow w = new ChangeWindow(EnumSet.of(MONDAY, SUNDAY), LocalTime.of(1, 0), LocalTime.of(5, 30), BERLIN);
        assertThat(w).hasToString("{days: [mon, sun], from: \"01:00\", until: \"05:30\", zone: Europe/Berlin}");
    }

    @Test
    void windowWithoutLengthOrDaysIsRejected() {
        assertThatThrownBy(() -> daily("01:00", "01:00", BERLIN)).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("window.until must differ from window.from (01:00): a window needs a length; an until before from"
                        + " spans midnight");
        assertThatThrownBy(() -> new ChangeWindow(Set.of(), LocalTime.of(1, 0), LocalTime.of(5, 0), BERLIN))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("window.days must name at least one day");
    }

    @Test
    void clockTimesAreHoursAndMinutes() {
        assertThat(ChangeWindow.parseClock("23:59")).isEqualTo(LocalTime.of(23, 59));
        assertThatThrownBy(() -> ChangeWindow.parseClock("1:00")).isInstanceOf(IllegalArgumentException.class)
                .hasMessage("a wall-clock time looks like \"01:00\" or \"23:30\" (HH:MM, 24-hour clock), got '1:00'");
    }
}
