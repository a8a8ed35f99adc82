package dev.tend.shared.wire;

import java.util.Locale;

/**
 * Why a line's time was refused at the wire (DESIGN.md section 3): one mistyped year must
 * not move event time anywhere. The wire name is the metrics label.
 */
public enum TimeRefusal {
    /** Before 1970-01-01T00:00:00Z. */
    BEFORE_1970,
    /** After the last instant of the year 2200. */
    AFTER_2200,
    /** More than {@code max-skew} ahead of the wall clock of a live input. */
    AHEAD_OF_CLOCK,
    /** Outside the {@code from}..{@code until} of the recording's header. */
    OUTSIDE_RECORDING;

    public String wireName() {
        return name().toLowerCase(Locale.ROOT).replace('_', '-');
    }
}
