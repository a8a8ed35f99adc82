package dev.tend.cli;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.atomic.AtomicLong;

import static org.assertj.core.api.Assertions.assertThat;

class ProgressTest {
    private static final long MIB = 1L << 20;
    private static final long SECOND = 1_000_000_000L;

    @Test
    void withoutATerminalItPrintsAPlainLineEveryTenSecondsWithRateShareAndTimeLeft() {
        AtomicLong now = new AtomicLong(0);
        StringWriter err = new StringWriter();
        Progress p = Progress.of("replaying week.jsonl", 100 * MIB, new PrintWriter(err, true), null, now::get);

        now.set(5 * SECOND);
        p.update(10 * MIB, 400);
        String afterFive = err.toString();
        now.set(10 * SECOND);
        p.update(25 * MIB, 1_000);
        now.set(12 * SECOND);
        p.update(30 * MIB, 1_200);

        assertThat(p.isBar()).isFalse();
        assertThat(afterFive).isEmpty();
        // a quarter done in 10 s leaves three times as long again
        assertThat(err.toString()).isEqualTo(
                "tend: replaying week.jsonl: 1,000 events (100/s), 25% of 100.0 MiB, 0:10 elapsed, about 0:30 left\n");
    }

    @Test
    void aSignalGetsWhereTheWorkStood() {
        AtomicLong now = new AtomicLong(0);
        Progress p = Progress.of("ingesting -", -1, new PrintWriter(new StringWriter(), true), null, now::get);

        now.set(3_725 * SECOND);
        p.update(0, 7_450);

        assertThat(p.summary()).isEqualTo("tend: ingesting - stopped: 7,450 events (2/s), 1:02:05 elapsed");
    }

    @Test
    void onATerminalTheLibraryDrawsABar() {
        ByteArrayOutputStream terminal = new ByteArrayOutputStream();
        StringWriter err = new StringWriter();
        Progress p = Progress.of("replaying week.jsonl", 100 * MIB, new PrintWriter(err, true),
                new PrintStream(terminal, true, StandardCharsets.UTF_8), System::nanoTime);

        p.update(50 * MIB, 12_345);
        p.close();

        assertThat(p.isBar()).isTrue();
        assertThat(err.toString()).as("no plain lines beside a bar").isEmpty();
        assertThat(terminal.toString(StandardCharsets.UTF_8)).contains("replaying week.jsonl", "50%", "50/100 MiB", "12,345");
    }
}
