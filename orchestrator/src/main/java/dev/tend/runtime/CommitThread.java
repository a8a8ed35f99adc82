package dev.tend.runtime;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;

/**
 * The thread that commits a decided batch while the driver decides the next one (see
 * {@link Orchestrator}): one commit at a time, in the order handed over. Its thread is a
 * daemon, started at the first commit and ended by {@link #close()}.
 */
final class CommitThread implements AutoCloseable {
    private ExecutorService thread;

    /** Runs {@code commit} on the committing thread; the future ends as it does (its failure as the cause). */
    CompletableFuture<Void> start(Runnable commit) {
        if (thread == null) {
            thread = Executors.newSingleThreadExecutor(r -> {
                Thread t = new Thread(r, "tend-commit");
                t.setDaemon(true);
                return t;
            });
        }
        return CompletableFuture.runAsync(commit, thread);
    }

    /**
     * Waits for {@code commit} to end, without being interrupted (the store must not be left
     * while it writes), and returns its failure, or null when it committed. An {@link Error}
     * is thrown as it is.
     */
    static RuntimeException outcome(CompletableFuture<Void> commit) {
        try {
            commit.join();
            return null;
        } catch (java.util.concurrent.CompletionException | java.util.concurrent.CancellationException e) {
            Throwable cause = e.getCause() == null ? e : e.getCause();
            if (cause instanceof Error err) throw err;
            if (cause instanceof RuntimeException r) return r;
            return new IllegalStateException(cause);
        }
    }

    @Override
    public void close() {
        if (thread != null) thread.shutdown();
        thread = null;
    }
}
