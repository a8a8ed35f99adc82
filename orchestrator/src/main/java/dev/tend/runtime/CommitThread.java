package dev.tend.runtime;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;

/**
 * The thread that commits decided batches while the driver decides the next ones (see
 * {@link CommitPipeline}): one commit at a time, in the order handed over. Its thread is a
 * daemon, started at the first commit and ended by {@link #close()}.
 */
final class CommitThread implements AutoCloseable {
    private ExecutorService thread;

    /**
     * Runs {@code commit} on the committing thread once {@code after} (null: nothing) has
     * completed; the future ends as the commit does (its failure as the cause), or, when
     * {@code after} failed, with that failure and without running the commit.
     */
    CompletableFuture<Void> start(CompletableFuture<Void> after, Runnable commit) {
        if (thread == null) {
            thread = Executors.newSingleThreadExecutor(r -> {
                Thread t = new Thread(r, "tend-commit");
                t.setDaemon(true);
                return t;
            });
        }
        return after == null ? CompletableFuture.runAsync(commit, thread) : after.thenRunAsync(commit, thread);
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
