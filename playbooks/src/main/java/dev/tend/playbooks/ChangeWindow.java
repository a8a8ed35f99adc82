package dev.tend.playbooks;

import org.quartz.CronExpression;

import java.text.ParseException;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.time.zone.ZoneOffsetTransition;
import java.time.zone.ZoneRules;
import java.util.ArrayList;
import java.util.Date;
import java.util.List;
import java.util.Objects;

/**
 * A change window: it opens each time the Quartz cron expression {@code cron} fires in
 * {@code zone}, and stays open for {@code length} of elapsed time. Openings that overlap
 * merge, so {@code "0 0 1 ? * MON-FRI"} with length 4h is open 01:00 to 05:00 local time on
 * weekdays, and {@code "0 0 1-5 ? * MON-FRI"} with length 4h is open 01:00 to 09:00.
 *
 * <p>Daylight-saving changes follow java.time's tz database, and the cron expression is
 * matched against local wall-clock time. A local opening time that falls into a gap (the
 * hour skipped in spring) opens the window at the instant {@code ZonedDateTime.of} gives,
 * moved forward by the length of the gap, so no day loses its window; a local opening time
 * that occurs twice (the hour repeated in autumn) opens it at both instants. Because
 * {@code length} is elapsed time, on the night of a change the window's wall-clock end
 * moves by the hour the clocks moved. Quartz's own zone handling is not used for the
 * mapping to instants, because it skips fire times in a gap and misses some in an overlap.
 *
 * <p>Immutable and thread-safe.
 */
public final class ChangeWindow {
    private final String cron;
    private final ZoneId zone;
    private final Duration length;
    private final CronExpression expression;
    private final ZoneRules rules;

    private ChangeWindow(String cron, ZoneId zone, Duration length, CronExpression expression) {
        this.cron = cron;
        this.zone = zone;
        this.length = length;
        this.expression = expression;
        this.rules = zone.getRules();
    }

    /**
     * Validates and builds a window. Throws {@link IllegalArgumentException} when Quartz
     * rejects the expression (its reason included) or the length is not longer than zero.
     */
    public static ChangeWindow of(String cron, ZoneId zone, Duration length) {
        Objects.requireNonNull(cron, "window.allow");
        Objects.requireNonNull(zone, "window.zone");
        Objects.requireNonNull(length, "window.length");
        if (length.isNegative() || length.isZero()) {
            throw new IllegalArgumentException("window.length must be longer than zero, got " + length);
        }
        return new ChangeWindow(cron, zone, length, parseCron(cron));
    }

    /**
     * Checks that Quartz accepts {@code cron}; throws {@link IllegalArgumentException} with
     * Quartz's reason and a reminder of the field order otherwise.
     */
    public static void validateCron(String cron) {
        parseCron(cron);
    }

    private static CronExpression parseCron(String cron) {
        CronExpression e;
        try {
            e = new CronExpression(cron);
        } catch (ParseException ex) {
            String fields = cron.strip().split("\\s+").length == 5
                    ? " (a Quartz cron has 6 or 7 fields: seconds minutes hours day-of-month month day-of-week [year]; this one has 5)"
                    : " (fields: seconds minutes hours day-of-month month day-of-week [year])";
            throw new IllegalArgumentException("Quartz rejects the cron expression '" + cron + "': " + ex.getMessage() + fields);
        }
        // local wall-clock time is matched as if it were UTC, which has no daylight saving
        e.setTimeZone(java.util.TimeZone.getTimeZone(ZoneOffset.UTC));
        return e;
    }

    public String cron() {
        return cron;
    }

    public ZoneId zone() {
        return zone;
    }

    public Duration length() {
        return length;
    }

    /** True when an opening happened in {@code (t - length, t]}: open at an opening, closed at its end. */
    public boolean isOpen(Instant t) {
        Instant opening = nextFireAfter(t.minus(length));
        return opening != null && !opening.isAfter(t);
    }

    /** {@code t} itself when the window is open at {@code t}, else the next opening; null if it never opens again. */
    public Instant nextOpening(Instant t) {
        return isOpen(t) ? t : nextFireAfter(t);
    }

    /**
     * The first opening strictly after {@code t}, or null. Local fire times are scanned in
     * order; near a clock change the mapping from local time to instants is not monotonic,
     * so the scan starts and ends a clock change's width around {@code t} and the best result.
     */
    Instant nextFireAfter(Instant t) {
        LocalDateTime local = nextLocalAtOrAfter(LocalDateTime.ofInstant(t, zone).minus(slackAround(t)));
        Instant best = null;
        LocalDateTime stopAfter = null;
        while (local != null) {
            if (stopAfter != null && local.isAfter(stopAfter)) break;
            for (Instant i : instantsOf(local)) {
                if (i.isAfter(t) && (best == null || i.isBefore(best))) {
                    best = i;
                    stopAfter = LocalDateTime.ofInstant(best, zone).plus(slackAround(best));
                }
            }
            local = nextLocalAfter(local);
        }
        return best;
    }

    private List<Instant> instantsOf(LocalDateTime local) {
        List<ZoneOffset> offsets = rules.getValidOffsets(local);
        List<Instant> out = new ArrayList<>(2);
        if (offsets.isEmpty()) {
            // a gap: as ZonedDateTime.of does, keep the offset from before the change
            ZoneOffsetTransition gap = rules.getTransition(local);
            out.add(local.toInstant(gap.getOffsetBefore()));
        } else {
            for (ZoneOffset o : offsets) out.add(local.toInstant(o));
        }
        return out;
    }

    /** The largest clock change within a day of {@code t}; zero far from any change. */
    private Duration slackAround(Instant t) {
        Duration slack = Duration.ZERO;
        Instant until = t.plus(Duration.ofDays(1));
        ZoneOffsetTransition tr = rules.nextTransition(t.minus(Duration.ofDays(1)));
        while (tr != null && !tr.getInstant().isAfter(until)) {
            Duration d = tr.getDuration().abs();
            if (d.compareTo(slack) > 0) slack = d;
            tr = rules.nextTransition(tr.getInstant());
        }
        return slack;
    }

    private LocalDateTime nextLocalAtOrAfter(LocalDateTime local) {
        return nextLocalAfter(local.minusSeconds(1).withNano(0));
    }

    private LocalDateTime nextLocalAfter(LocalDateTime local) {
        Date next;
        synchronized (expression) { // Quartz does not promise that a CronExpression may be shared between threads
            next = expression.getNextValidTimeAfter(Date.from(local.toInstant(ZoneOffset.UTC)));
        }
        return next == null ? null : LocalDateTime.ofInstant(next.toInstant(), ZoneOffset.UTC);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ChangeWindow w && w.cron.equals(cron) && w.zone.equals(zone) && w.length.equals(length);
    }

    @Override
    public int hashCode() {
        return Objects.hash(cron, zone, length);
    }

    @Override
    public String toString() {
        return "{allow: \"" + cron + "\", zone: " + zone + ", length: " + dev.tend.shared.time.Durations.format(length) + "}";
    }
}
