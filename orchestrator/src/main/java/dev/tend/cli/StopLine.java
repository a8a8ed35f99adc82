package dev.tend.cli;

import java.io.PrintWriter;

/**
 * The one line a long-running command prints when it stops, whether the main thread gets
 * there or a shutdown hook (SIGINT, SIGTERM) does first: printed once, never twice.
 */
final class StopLine {
    private final PrintWriter out;
    private final String line;
    private boolean printed;

    StopLine(PrintWriter out, String line) {
        this.out = out;
        this.line = line;
    }

    /**
     * Prints the line unless it was printed. Held under the lock while it writes: when the main
     * thread gets here first, a shutdown hook calling this waits until the line is out instead
     * of returning at once and letting the JVM halt before the main thread wrote it (a race
     * that could lose the line; a serve test once missed it under heavy load).
     */
    synchronized void print() {
        if (printed) return;
        printed = true;
        out.println(line);
        out.flush();
    }
}
