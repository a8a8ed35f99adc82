package dev.tend.cli;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.time.Durations;
import dev.tend.shared.wire.Rfc3339;

import java.time.Clock;
import java.time.Instant;
import java.time.LocalTime;
import java.time.ZonedDateTime;
import java.time.format.DateTimeParseException;

/**
 * A time on the command line: an RFC 3339 time ({@code 2027-03-14T22:00:00Z}), a clock time
 * meaning its latest past occurrence in the local zone ({@code 22:00}), or a duration ago
 * ({@code 8h}). Anything else is an {@link InvalidInputException} naming the option.
 */
final class TimeArg {
    private static final String FORMS = "use an RFC 3339 time like 2027-03-14T22:00:00Z, a clock time like 22:00,"
            + " or a duration ago like 8h";

    private TimeArg() {
    }

    static Instant parse(String option, String text, Clock clock) {
        if (text == null) return null;
        if (text.matches("\\d{1,2}:\\d{2}")) {
            LocalTime t;
            try {
                t = LocalTime.parse(text.length() == 4 ? "0" + text : text);
            } catch (DateTimeParseException e) {
                throw invalid(option, "'" + text + "' is not a clock time: hours go from 00 to 23 and minutes from 00 to 59");
            }
            ZonedDateTime now = ZonedDateTime.now(clock);
            ZonedDateTime at = now.with(t).withSecond(0).withNano(0);
            if (at.isAfter(now)) at = at.minusDays(1);
            return at.toInstant();
        }
        if (text.matches("(\\d+[smhd])+")) {
            try {
                return clock.instant().minus(Durations.parse(text));
            } catch (IllegalArgumentException e) {
                throw invalid(option, e.getMessage());
            }
        }
        try {
            return Rfc3339.parse(text);
        } catch (IllegalArgumentException | DateTimeParseException e) {
            throw invalid(option, "'" + text + "' is not a time: " + FORMS);
        }
    }

    /** An RFC 3339 time, or a duration from now (an exclusion's end). */
    static Instant ahead(String option, String text, Clock clock) {
        if (text.matches("(\\d+[smhd])+")) {
            try {
                return clock.instant().plus(Durations.parse(text));
            } catch (IllegalArgumentException e) {
                throw invalid(option, e.getMessage());
            }
        }
        try {
            return Rfc3339.parse(text);
        } catch (IllegalArgumentException | DateTimeParseException e) {
            throw invalid(option, "'" + text + "' is not a time: use an RFC 3339 time like 2027-03-15T06:00:00Z"
                    + " or a duration from now like 4h");
        }
    }

    static InvalidInputException invalid(String option, String message) {
        return new InvalidInputException(Problem.at(option, 0, 0, option.replaceFirst("^--", ""), message));
    }
}
