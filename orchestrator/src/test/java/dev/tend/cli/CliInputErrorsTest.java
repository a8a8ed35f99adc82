package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

/** Every usage or input error is one located sentence and exit 2, never a stack trace. */
class CliInputErrorsTest {
    @TempDir
    Path dir;

    private static void assertOneSentence(CliRun r, String option, String words) {
        assertThat(r.exit()).as(r.err()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err().strip().lines().count()).as(r.err()).isEqualTo(1);
        assertThat(r.err()).startsWith(option + ": ").contains(words).doesNotContain("\tat ").doesNotContain("Exception");
    }

    @Test
    void auditSinceAWordIsOneSentenceNamingTheOption() {
        assertOneSentence(CliRun.of("audit", "--db", dir.resolve("tend.db").toString(), "--since", "yesterday"),
                "--since", "'yesterday' is not a time");
    }

    @Test
    void handoverSinceAnHourPastTheDayIsOneSentenceNamingTheOption() {
        assertOneSentence(CliRun.of("handover", "--db", dir.resolve("tend.db").toString(), "--since", "25:00"),
                "--since", "'25:00' is not a clock time");
    }

    @Test
    void excludeUntilAWordIsOneSentenceBeforeAnyServerIsAsked() {
        assertOneSentence(CliRun.of("exclude", "add", "fares-3", "--reason", "disk swap", "--owner", "olga",
                "--until", "tomorrow", "--server", "http://127.0.0.1:9", "--token", "t"), "--until", "'tomorrow' is not a time");
    }

    @Test
    void aDurationLongerThanTendKeepsIsOneSentence() {
        assertOneSentence(CliRun.of("audit", "--db", dir.resolve("tend.db").toString(), "--since", "100000d"),
                "--since", "at most 3650d");
    }
}
