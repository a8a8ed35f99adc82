package dev.tend.shared;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;

/** Waiting for work done on another thread, with what it threw rethrown as it was. */
public final class Futures {
    private Futures() {
    }

    /**
     * {@code work} computed on a daemon thread of its own named {@code name}, while the caller
     * goes on: the future completes with its value, or with what it threw (an {@link Error} too).
     */
    public static <T> CompletableFuture<T> onThread(String name, java.util.function.Supplier<T> work) {
        CompletableFuture<T> f = new CompletableFuture<>();
        Thread t = new Thread(() -> {
            try {
                f.complete(work.get());
            } catch (Throwable e) {
                f.completeExceptionally(e);
            }
        }, name);
        t.setDaemon(true);
        t.start();
        return f;
    }

    /**
     * The value of {@code f} once computed; a {@link RuntimeException} or {@link Error} that
     * computing it threw is rethrown itself, not wrapped in a {@link CompletionException}.
     */
    public static <T> T joined(CompletableFuture<T> f) {
        try {
            return f.join();
        } catch (CompletionException e) {
            if (e.getCause() instanceof RuntimeException r) throw r;
            if (e.getCause() instanceof Error err) throw err;
            throw e;
        }
    }
}
