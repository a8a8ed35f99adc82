package dev.tend.cli;

import me.tongfei.progressbar.ConsoleProgressBarConsumer;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

import java.io.PrintStream;
import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.function.LongSupplier;

/**
 * How far long work (a replay, an ingest) has come, on standard error: on a terminal a bar
 * drawn by {@code me.tongfei:progressbar} (share done, rate, elapsed, time left); otherwise,
 * so that a log or a pipe stays readable, one plain line every {@link #PLAIN_EVERY}. Work is
 * counted in events; when the size of the input is known, in bytes of it too, which gives the
 * share done and the time left. {@link #summary()} says where the work stood, for a signal
 * that stops it. Updates come from one thread; {@link #summary()} may be called from another.
 */
final class Progress implements AutoCloseable {
    static final Duration PLAIN_EVERY = Duration.ofSeconds(10);
    private static final long MIB = 1L << 20;

    private final String task;
    private final PrintWriter err;
    private final long totalBytes;
    private final LongSupplier nanoTime;
    private final long startNanos;
    private final me.tongfei.progressbar.ProgressBar bar;
    private volatile long bytes;
    private volatile long events;
    private long lastPlainNanos;

    private Progress(String task, PrintWriter err, long totalBytes, LongSupplier nanoTime, me.tongfei.progressbar.ProgressBar bar) {
        this.task = task;
        this.err = err;
        this.totalBytes = totalBytes;
        this.nanoTime = nanoTime;
        this.startNanos = nanoTime.getAsLong();
        this.lastPlainNanos = startNanos;
        this.bar = bar;
    }

    /** A bar on {@code terminal} when it is not null, plain lines on {@code err} otherwise; {@code totalBytes} -1 when unknown. */
    static Progress of(String task, long totalBytes, PrintWriter err, PrintStream terminal, LongSupplier nanoTime) {
        if (terminal == null) return new Progress(task, err, totalBytes, nanoTime, null);
        ProgressBarBuilder b = new ProgressBarBuilder().setTaskName(task).setStyle(ProgressBarStyle.ASCII)
                .setConsumer(new ConsoleProgressBarConsumer(terminal)).setUpdateIntervalMillis(500).showSpeed();
        b = totalBytes > 0 ? b.setInitialMax(totalBytes).setUnit(" MiB", MIB) : b.setInitialMax(-1).setUnit(" events", 1);
        return new Progress(task, err, totalBytes, nanoTime, b.build());
    }

    /** For standard error: a bar when there is a terminal (a console), plain lines otherwise. */
    static Progress onStderr(String task, long totalBytes, PrintWriter err) {
        return of(task, totalBytes, err, System.console() != null ? System.err : null, System::nanoTime);
    }

    boolean isBar() {
        return bar != null;
    }

    /** {@code bytesDone} of the input (ignored when its size is unknown) and {@code eventsDone} events so far. */
    void update(long bytesDone, long eventsDone) {
        bytes = bytesDone;
        events = eventsDone;
        if (bar != null) {
            bar.stepTo(totalBytes > 0 ? bytesDone : eventsDone);
            if (totalBytes > 0) bar.setExtraMessage(String.format(Locale.ROOT, "%,d events", eventsDone));
            return;
        }
        long now = nanoTime.getAsLong();
        if (now - lastPlainNanos >= PLAIN_EVERY.toNanos()) {
            lastPlainNanos = now;
            err.println(line());
            err.flush();
        }
    }

    /** Where the work stands, in one line: events, rate, share done, elapsed and time left. */
    String line() {
        return line(": ");
    }

    private String line(String afterTask) {
        Duration elapsed = Duration.ofNanos(nanoTime.getAsLong() - startNanos);
        long b = bytes, e = events;
        StringBuilder sb = new StringBuilder("tend: ").append(task).append(afterTask)
                .append(String.format(Locale.ROOT, "%,d events", e));
        double seconds = elapsed.toNanos() / 1e9;
        if (seconds > 0) sb.append(String.format(Locale.ROOT, " (%,d/s)", Math.round(e / seconds)));
        if (totalBytes > 0) {
            double share = Math.min(1.0, (double) b / totalBytes);
            sb.append(String.format(Locale.ROOT, ", %.0f%% of %.1f MiB", share * 100, totalBytes / (double) MIB));
            sb.append(", ").append(clock(elapsed)).append(" elapsed");
            if (share > 0 && share < 1) sb.append(", about ").append(clock(Duration.ofNanos(Math.round(elapsed.toNanos() * (1 - share) / share)))).append(" left");
        } else {
            sb.append(", ").append(clock(elapsed)).append(" elapsed");
        }
        return sb.toString();
    }

    /** What a signal that stops the work leaves behind, said once: where it stood. */
    String summary() {
        return line(" stopped: ");
    }

    static String clock(Duration d) {
        long s = d.toSeconds();
        return s >= 3600 ? String.format(Locale.ROOT, "%d:%02d:%02d", s / 3600, s / 60 % 60, s % 60)
                : String.format(Locale.ROOT, "%d:%02d", s / 60, s % 60);
    }

    /** Ends the bar (the plain mode prints nothing more). */
    @Override
    public void close() {
        if (bar != null) bar.close();
    }
}
