package dev.tend.cli;

import java.io.PrintWriter;
import java.util.function.Supplier;

/**
 * While long work runs, a shutdown hook that says where it stood when SIGINT (Ctrl-C) or
 * SIGTERM stopped it; closed (the hook removed) once the work ended by itself.
 */
final class StopSummary implements AutoCloseable {
    private final Thread hook;

    StopSummary(PrintWriter err, Supplier<String> summary) {
        this.hook = new Thread(() -> {
            err.println(summary.get());
            err.flush();
        }, "tend-stop-summary");
        Runtime.getRuntime().addShutdownHook(hook);
    }

    @Override
    public void close() {
        try {
            Runtime.getRuntime().removeShutdownHook(hook);
        } catch (IllegalStateException shuttingDown) {
            // a signal is stopping the JVM: the hook runs and says where the work stood
        }
    }
}
