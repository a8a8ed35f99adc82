package dev.tend.cli;

import dev.tend.shared.time.Durations;
import dev.tend.shared.wire.Rfc3339;

import java.time.Clock;
import java.time.Instant;
import java.time.LocalTime;
import java.time.ZonedDateTime;

/**
 * A time on the command line: an RFC 3339 time ({@code 2027-03-14T22:00:00Z}), a clock time
 * meaning its latest past occurrence in the local zone ({@code 22:00}), or a duration ago
 * ({@code 8h}).
 */
final class TimeArg {
    private TimeArg() {
    }

    static Instant parse(String text, Clock clock) {
        if (text == null) return null;
        if (text.matches("\\d{1,2}:\\d{2}")) {
            LocalTime t = LocalTime.parse(text.length() == 4 ? "0" + text : text);
            ZonedDateTime now = ZonedDateTime.now(clock);
            ZonedDateTime at = now.with(t).withSecond(0).withNano(0);
            if (at.isAfter(now)) at = at.minusDays(1);
            return at.toInstant();
        }
        if (text.matches("(\\d+[smhd])+")) return clock.instant().minus(Durations.parse(text));
        try {
            return Rfc3339.parse(text);
        } catch (IllegalArgumentException e) {
            throw new picocli.CommandLine.TypeConversionException("'" + text
                    + "' is not a time: use an RFC 3339 time like 2027-03-14T22:00:00Z, a clock time like 22:00, or a duration ago like 8h");
        }
    }
}
