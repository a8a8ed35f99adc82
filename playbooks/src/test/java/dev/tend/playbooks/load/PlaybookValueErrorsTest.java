package dev.tend.playbooks.load;

import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;

import java.util.List;

import static dev.tend.playbooks.TestDir.column;
import static org.assertj.core.api.Assertions.assertThat;

/** Each mistake in a playbook's values (durations, rates, days, times, windows, time zones) is reported with file, line, column and a sentence. */
class PlaybookValueErrorsTest extends PlaybookErrorsFixture {
    @Test
    void durationInWordsIsRejectedWithTheCompactForm() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits:
                  cooldown: 5 minutes
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 4, 13, "limits.cooldown: a duration looks like 30s, 5m, 6h or 1d, got '5 minutes'");
    }

    @Test
    void rateInWordsIsRejectedWithTheCountSlashDurationForm() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits:
                  rate: 10 per hour
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 4, 9, "limits.rate: a rate looks like 10/1h (a count, a slash, then a"
                + " duration such as 30m, 1h or 1d), got '10 per hour'");
    }

    @Test
    void dayThatIsNotADayNamesTheAcceptedForms() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { days: [mon-fry], from: "01:00", until: "05:00", zone: Europe/Berlin }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, column(text, 3, "mon-fry"), "window.days: 'mon-fry' is not a day or a"
                + " range of days; write mon, tue, wed, thu, fri, sat or sun, or a range such as mon-fri");
    }

    @Test
    void wallClockTimeMustBeHoursAndMinutes() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { days: [sat], from: "1am", until: "24:00", zone: Europe/Berlin }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        List<Problem> problems = load("p1.yaml", text);
        assertThat(problems).extracting(Problem::message).containsExactly(
                "window.from: a wall-clock time looks like \"01:00\" or \"23:30\" (HH:MM, 24-hour clock), got '1am'",
                "window.until: a wall-clock time looks like \"01:00\" or \"23:30\" (HH:MM, 24-hour clock), got '24:00'");
    }

    @Test
    void windowWithoutLengthIsRejected() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { from: "01:00", until: "01:00", zone: UTC }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, column(text, 3, "until") + "until: ".length(), "window.until must differ from window.from:"
                + " a window needs a length; an until before from spans midnight");
    }

    @Test
    void emptyDaysIsRejected() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { days: [], from: "01:00", until: "05:00", zone: UTC }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, column(text, 3, "[]"), "window.days is empty; name at least one day,"
                + " such as [mon-fri], or leave days out for every day");
    }

    @Test
    void unknownTimeZoneSuggestsTzDatabaseNames() {
        String text = """
                playbook: p1
                trigger: { signal: heartbeat, state: silent, scope: node }
                window: { days: [mon-fri], from: "01:00", until: "05:00", zone: Europe/Berln }
                steps:
                  - { id: drain, action: drain-node, timeout: 10m }
                """;
        assertOnly(load("p1.yaml", text), "p1.yaml", 3, column(text, 3, "Europe/Berln"), "window.zone: unknown time zone"
                + " 'Europe/Berln'; use a name from the tz database such as Europe/Berlin, America/New_York or UTC");
    }
}
