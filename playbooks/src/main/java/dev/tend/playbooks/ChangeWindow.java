package dev.tend.playbooks;

import java.time.DayOfWeek;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalTime;
import java.time.ZoneId;
import java.time.ZonedDateTime;
import java.util.Collections;
import java.util.EnumSet;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import java.util.Set;
import java.util.regex.Pattern;
import java.util.stream.Collectors;

/**
 * A change window: on each of {@code days} it opens at the wall-clock time {@code from} of
 * {@code zone} and closes at {@code until}; an {@code until} at or before {@code from} closes
 * on the next day (the window spans midnight, and belongs to the day it opens on). The
 * opening is inclusive, the closing exclusive.
 *
 * <p>Wall-clock times become instants through java.time's zone rules, as
 * {@link ZonedDateTime#of} maps them: a time in the hour skipped in spring moves forward by
 * the length of the gap, and a time in the hour repeated in autumn is taken at its first
 * occurrence. So on the nights the clocks change the window still opens and closes at the
 * written times on the clock, and lasts an hour less or more. When that shift carries the
 * opening past the closing (from 02:30 until 03:00 on a night 02:00 becomes 03:00), the window
 * does not open that day.
 *
 * <p>Immutable and thread-safe.
 *
 * @param days  the days of the week it opens on; not empty
 * @param from  the wall-clock time it opens
 * @param until the wall-clock time it closes; not equal to {@code from}
 * @param zone  the time zone of {@code from} and {@code until}
 */
public record ChangeWindow(Set<DayOfWeek> days, LocalTime from, LocalTime until, ZoneId zone) {
    private static final Pattern CLOCK = Pattern.compile("([01][0-9]|2[0-3]):[0-5][0-9]");
    private static final List<String> DAY_NAMES = List.of("mon", "tue", "wed", "thu", "fri", "sat", "sun");
    /** Far enough to pass any run of days whose windows lie in a skipped hour. */
    private static final int DAYS_AHEAD = 15;

    public ChangeWindow {
        Objects.requireNonNull(days, "window.days");
        Objects.requireNonNull(from, "window.from");
        Objects.requireNonNull(until, "window.until");
        Objects.requireNonNull(zone, "window.zone");
        if (days.isEmpty()) throw new IllegalArgumentException("window.days must name at least one day");
        if (from.equals(until)) {
            throw new IllegalArgumentException("window.until must differ from window.from (" + clock(from) + "): a window"
                    + " needs a length; an until before from spans midnight");
        }
        days = Collections.unmodifiableSet(EnumSet.copyOf(days));
    }

    /** Every day of the week. */
    public static Set<DayOfWeek> everyDay() {
        return EnumSet.allOf(DayOfWeek.class);
    }

    /**
     * A day name ({@code mon} ... {@code sun}) or a range of them ({@code mon-fri}; a range
     * may wrap past Sunday, {@code fri-mon}). Throws {@link IllegalArgumentException} naming
     * the accepted forms otherwise.
     */
    public static Set<DayOfWeek> parseDays(String text) {
        String t = text.strip().toLowerCase(Locale.ROOT);
        int dash = t.indexOf('-');
        if (dash < 0) return EnumSet.of(day(t, text));
        DayOfWeek first = day(t.substring(0, dash), text);
        DayOfWeek last = day(t.substring(dash + 1), text);
        Set<DayOfWeek> out = EnumSet.of(first);
        for (DayOfWeek d = first; d != last; ) {
            d = d.plus(1);
            out.add(d);
        }
        return out;
    }

    private static DayOfWeek day(String name, String text) {
        int i = DAY_NAMES.indexOf(name.strip());
        if (i < 0) {
            throw new IllegalArgumentException("'" + text + "' is not a day or a range of days; write mon, tue, wed, thu, fri,"
                    + " sat or sun, or a range such as mon-fri");
        }
        return DayOfWeek.of(i + 1);
    }

    /** A wall-clock time written {@code HH:MM} (24-hour clock, {@code 00:00} to {@code 23:59}). */
    public static LocalTime parseClock(String text) {
        String t = text.strip();
        if (!CLOCK.matcher(t).matches()) {
            throw new IllegalArgumentException("a wall-clock time looks like \"01:00\" or \"23:30\" (HH:MM, 24-hour clock),"
                    + " got '" + text + "'");
        }
        return LocalTime.parse(t);
    }

    /** True when {@code until} is at or before {@code from}: the window closes on the day after it opens. */
    public boolean spansMidnight() {
        return !until.isAfter(from);
    }

    /** True when {@code t} lies in an opening: at or after its start, before its end. */
    public boolean isOpen(Instant t) {
        LocalDate today = LocalDate.ofInstant(t, zone);
        for (LocalDate d = today.minusDays(1); !d.isAfter(today); d = d.plusDays(1)) {
            if (!days.contains(d.getDayOfWeek())) continue;
            Instant open = opening(d);
            if (!t.isBefore(open) && t.isBefore(closing(d))) return true;
        }
        return false;
    }

    /** {@code t} itself when the window is open at {@code t}, else the start of the next opening; null if none follows soon. */
    public Instant nextOpening(Instant t) {
        if (isOpen(t)) return t;
        LocalDate today = LocalDate.ofInstant(t, zone);
        for (LocalDate d = today; d.isBefore(today.plusDays(DAYS_AHEAD)); d = d.plusDays(1)) {
            if (!days.contains(d.getDayOfWeek())) continue;
            Instant open = opening(d);
            if (open.isAfter(t) && open.isBefore(closing(d))) return open;
        }
        return null;
    }

    /** The instant the opening of {@code day} starts (that day's {@code from} in the zone). */
    public Instant opening(LocalDate day) {
        return ZonedDateTime.of(day, from, zone).toInstant();
    }

    /** The instant the opening of {@code day} ends (its {@code until}, on the next day when it spans midnight). */
    public Instant closing(LocalDate day) {
        return ZonedDateTime.of(spansMidnight() ? day.plusDays(1) : day, until, zone).toInstant();
    }

    private static String clock(LocalTime t) {
        return String.format(Locale.ROOT, "%02d:%02d", t.getHour(), t.getMinute());
    }

    /** As written in a playbook: {@code {days: [mon, tue], from: "01:00", until: "05:00", zone: Europe/Berlin}}. */
    @Override
    public String toString() {
        String names = days.stream().map(d -> DAY_NAMES.get(d.getValue() - 1)).collect(Collectors.joining(", "));
        return "{days: [" + names + "], from: \"" + clock(from) + "\", until: \"" + clock(until) + "\", zone: " + zone + "}";
    }
}
