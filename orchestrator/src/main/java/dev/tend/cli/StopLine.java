package dev.tend.cli;

import java.io.PrintWriter;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * The one line a long-running command prints when it stops, whether the main thread gets
 * there or a shutdown hook (SIGINT, SIGTERM) does first: printed once, never twice.
 */
final class StopLine {
    private final PrintWriter out;
    private final String line;
    private final AtomicBoolean printed = new AtomicBoolean();

    StopLine(PrintWriter out, String line) {
        this.out = out;
        this.line = line;
    }

    void print() {
        if (printed.compareAndSet(false, true)) {
            out.println(line);
            out.flush();
        }
    }
}
