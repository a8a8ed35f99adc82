package dev.tend.cli;

import dev.tend.replay.ReplayListener;
import dev.tend.shared.Problem;

import java.io.PrintWriter;

/**
 * What {@code tend replay} shows on standard error while it runs: its {@link Progress} (a bar
 * on a terminal, a plain line every ten seconds otherwise) and the recording's bad lines (the
 * first {@value #SHOWN}, then a count).
 */
final class ReplayProgress implements ReplayListener {
    static final int SHOWN = 20;

    private final PrintWriter err;
    private final Progress progress;
    private long problems;

    ReplayProgress(PrintWriter err, Progress progress) {
        this.err = err;
        this.progress = progress;
    }

    @Override
    public void problem(Problem problem) {
        problems++;
        if (problems > SHOWN) return;
        // on a terminal the bar's line is overwritten by the problem and drawn again below it
        err.println((progress.isBar() ? "\r" : "") + problem + " (line skipped)");
        err.flush();
    }

    @Override
    public void progress(long bytesRead, long bytesTotal, long events) {
        progress.update(bytesRead, events);
    }

    @Override
    public void done() {
        progress.close();
        if (problems > SHOWN) err.println("... and " + (problems - SHOWN) + " more bad lines skipped");
        err.flush();
    }
}
