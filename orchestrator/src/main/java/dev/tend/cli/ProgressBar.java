package dev.tend.cli;

import dev.tend.replay.ReplayListener;
import dev.tend.shared.Problem;

import java.io.PrintWriter;

/**
 * What {@code tend replay} shows on standard error while it runs: the recording's bad lines
 * (the first {@value #SHOWN}, then a count), and, when standard error is a terminal, a bar
 * of how much of the recording has been fed. Nothing else, so a pipe or a log gets only the
 * problems.
 */
final class ProgressBar implements ReplayListener {
    static final int SHOWN = 20;
    private static final int WIDTH = 30;

    private final PrintWriter err;
    private final boolean terminal;
    private final String label;
    private int shownPercent = -1;
    private long problems;

    ProgressBar(PrintWriter err, boolean terminal, String label) {
        this.err = err;
        this.terminal = terminal;
        this.label = label;
    }

    /** A bar on standard error when it is a terminal (there is a console), problems only otherwise. */
    static ProgressBar forStderr(PrintWriter err, String label) {
        return new ProgressBar(err, System.console() != null, label);
    }

    @Override
    public void problem(Problem problem) {
        problems++;
        if (problems > SHOWN) return;
        clear();
        err.println(problem + " (line skipped)");
        err.flush();
        if (terminal && shownPercent >= 0) draw(shownPercent);
    }

    @Override
    public void progress(long bytesRead, long bytesTotal) {
        if (!terminal || bytesTotal <= 0) return;
        int percent = (int) Math.min(100, bytesRead * 100 / bytesTotal);
        if (percent == shownPercent) return;
        shownPercent = percent;
        draw(percent);
    }

    @Override
    public void done() {
        clear();
        if (problems > SHOWN) err.println("... and " + (problems - SHOWN) + " more bad lines skipped");
        err.flush();
    }

    private void draw(int percent) {
        int filled = percent * WIDTH / 100;
        err.print("\r" + label + " [" + "#".repeat(filled) + " ".repeat(WIDTH - filled) + "] " + percent + "%");
        err.flush();
    }

    private void clear() {
        if (terminal && shownPercent >= 0) {
            err.print("\r" + " ".repeat(label.length() + WIDTH + 8) + "\r");
            shownPercent = -1;
        }
    }
}
