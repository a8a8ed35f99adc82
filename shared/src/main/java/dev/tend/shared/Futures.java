package dev.tend.shared;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;

/** Waiting for work done on another thread, with what it threw rethrown as it was. */
public final class Futures {
    private Futures() {
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
