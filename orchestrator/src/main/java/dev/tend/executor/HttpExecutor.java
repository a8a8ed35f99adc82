package dev.tend.executor;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.playbooks.HttpAction;
import io.github.resilience4j.core.IntervalFunction;
import io.github.resilience4j.retry.Retry;
import io.github.resilience4j.retry.RetryConfig;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.net.http.HttpTimeoutException;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Consumer;

/**
 * Calls an HTTP endpoint for an {@link HttpAction}: the action's method (POST by default)
 * with the rendered JSON body to the rendered URL, header {@code Idempotency-Key: <key>}.
 * A 2xx answer is success. A 5xx answer or a failed connection is tried again, with the
 * same key, after an exponentially growing pause, up to the action's {@code retries}
 * (resilience4j's retry, scheduled on a thread of its own, never blocking one); a
 * 4xx (or any other) answer is the receiver's decision and is never tried again. The whole
 * attempt, pauses included, ends at the call's timeout. The result's detail holds the status,
 * the number of tries and the first KiB of the last response body.
 *
 * <p>Asking again after a crash is safe ({@link #canAskAgain} is true): the receiver
 * de-duplicates by the key. Thread-safe; calls run on the client's threads, never the caller's.
 */
public final class HttpExecutor implements Executor {
    /** Bytes of the response body kept in the result. */
    public static final int BODY_LIMIT = 1024;
    private static final ObjectMapper JSON = new ObjectMapper();

    private final dev.tend.http.OutgoingHttp http;
    /** The pause before try n + 1 (resilience4j's exponential backoff, as the webhook sender's retries use). */
    private final IntervalFunction backoff;
    /** The retry of an action with n retries: n + 1 tries, each pause from {@link #backoff}, again only on a {@link Try#again}. */
    private final Map<Integer, RetryConfig> retryOf = new ConcurrentHashMap<>();
    private final ScheduledExecutorService pauses = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "tend-http-retry");
        t.setDaemon(true);
        return t;
    });

    /**
     * @param firstPause the pause before the first retry; each later pause doubles
     * @param maxPause   no pause is longer than this
     */
    public HttpExecutor(Duration firstPause, Duration maxPause) {
        this(firstPause, maxPause, new dev.tend.http.OutgoingHttp());
    }

    /** As above, with the clients (TLS, headers, bearer tokens) of {@code http}, which webhooks share. */
    public HttpExecutor(Duration firstPause, Duration maxPause, dev.tend.http.OutgoingHttp http) {
        Objects.requireNonNull(firstPause, "firstPause");
        Objects.requireNonNull(maxPause, "maxPause");
        if (firstPause.toMillis() < 1) {
            throw new IllegalArgumentException("firstPause must be at least 1 ms, got " + firstPause);
        }
        if (maxPause.compareTo(firstPause) < 0) {
            throw new IllegalArgumentException("maxPause must be at least firstPause " + firstPause + ", got " + maxPause);
        }
        this.backoff = IntervalFunction.ofExponentialBackoff(firstPause, 2.0, maxPause);
        this.http = Objects.requireNonNull(http, "http");
    }

    /** Pauses of 500 ms, 1 s, 2 s ... up to 30 s between tries. */
    public static HttpExecutor withDefaults() {
        return withDefaults(new dev.tend.http.OutgoingHttp());
    }

    /** The default pauses, with the given clients. */
    public static HttpExecutor withDefaults(dev.tend.http.OutgoingHttp http) {
        return new HttpExecutor(Duration.ofMillis(500), Duration.ofSeconds(30), http);
    }

    @Override
    public String kind() {
        return "http";
    }

    @Override
    public boolean canAskAgain(Effect.CallExecutor call) {
        return true;
    }

    @Override
    public void execute(Effect.CallExecutor call, Consumer<Input.ExecutorResult> done) {
        HttpAction action = (HttpAction) call.action();
        Map<String, String> values = Placeholders.of(call);
        URI uri;
        HttpRequest.BodyPublisher body;
        try {
            uri = URI.create(action.url().render(values));
            Map<String, Object> rendered = action.renderBody(values);
            body = rendered.isEmpty() ? HttpRequest.BodyPublishers.noBody()
                    : HttpRequest.BodyPublishers.ofByteArray(JSON.writeValueAsBytes(rendered));
        } catch (IllegalArgumentException | JsonProcessingException e) {
            done.accept(result(call, false, "could not build the request: " + e.getMessage(), Map.of()));
            return;
        }
        long deadline = System.nanoTime() + call.timeout().toNanos();
        Attempt attempt = new Attempt(call, action, uri, body, deadline);
        RetryConfig config = retryOf.computeIfAbsent(action.retries(), n -> RetryConfig.<Try>custom()
                .maxAttempts(n + 1)
                .intervalFunction(backoff)
                .retryOnResult(Try::again)
                .retryOnException(e -> false)
                .build());
        Retry.of("http-" + call.key(), config).executeCompletionStage(pauses, attempt::send).whenComplete((t, failure) -> {
            if (failure != null) done.accept(result(call, false, "could not send the request: " + failure, Map.of()));
            else done.accept(attempt.finish(t));
        });
    }

    /**
     * How one try ended: {@code again} when it may be tried again (a 5xx answer or a failed
     * connection), with the result it gives if no try is left.
     */
    private record Try(boolean again, boolean ok, String message, int tries, Map<String, Object> detail) {
        static Try last(boolean ok, String message, int tries, Map<String, Object> detail) {
            return new Try(false, ok, message, tries, detail);
        }
    }

    /** One attempt of a step: the tries of one request, all with the call's idempotency key. */
    private final class Attempt {
        private final Effect.CallExecutor call;
        private final HttpAction action;
        private final URI uri;
        private final HttpRequest.BodyPublisher body;
        private final long deadline;
        private final AtomicInteger tried = new AtomicInteger();

        Attempt(Effect.CallExecutor call, HttpAction action, URI uri, HttpRequest.BodyPublisher body, long deadline) {
            this.call = call;
            this.action = action;
            this.uri = uri;
            this.body = body;
            this.deadline = deadline;
        }

        /** The next try. */
        CompletionStage<Try> send() {
            int tries = tried.incrementAndGet();
            Duration left = Duration.ofNanos(deadline - System.nanoTime());
            if (left.isNegative() || left.isZero()) {
                return CompletableFuture.completedFuture(
                        Try.last(false, "timed out after " + call.timeout().toMillis() + " ms (" + (tries - 1) + " tries)", tries - 1, null));
            }
            HttpRequest.Builder b;
            try {
                b = http.authorize(HttpRequest.newBuilder(uri).timeout(left), action.client())
                        .header("Idempotency-Key", call.key()).method(action.method(), body);
            } catch (RuntimeException e) {
                // a bearer token file that vanished or emptied: the message names the file, never the token
                return CompletableFuture.completedFuture(Try.last(false, "could not build the request: " + e.getMessage(), tries - 1, null));
            }
            if (!action.body().isEmpty()) b.header("Content-Type", "application/json");
            return http.client(action.client()).sendAsync(b.build(), info -> FirstBytes.subscriber(BODY_LIMIT))
                    .handle((response, failure) -> failure != null ? onFailure(tries, failure) : onResponse(tries, response));
        }

        private Try onResponse(int tries, HttpResponse<byte[]> response) {
            int status = response.statusCode();
            Map<String, Object> detail = new LinkedHashMap<>();
            detail.put("status", status);
            detail.put("response", FirstBytes.text(response.body()));
            if (status >= 200 && status < 300) return Try.last(true, "HTTP " + status, tries, detail);
            if (status >= 500) {
                return new Try(true, false, "HTTP " + status + " after " + tries + (tries == 1 ? " try" : " tries"), tries, detail);
            }
            return Try.last(false, "HTTP " + status + " (not tried again: the receiver refused the request)", tries, detail);
        }

        private Try onFailure(int tries, Throwable failure) {
            Throwable cause = failure instanceof CompletionException && failure.getCause() != null ? failure.getCause() : failure;
            if (cause instanceof HttpTimeoutException) {
                return Try.last(false, "timed out after " + call.timeout().toMillis() + " ms (" + tries + (tries == 1 ? " try)" : " tries)"),
                        tries, null);
            }
            return new Try(cause instanceof IOException, false, "could not reach " + uri.getHost() + ":" + uri.getPort() + " after "
                    + tries + (tries == 1 ? " try: " : " tries: ") + cause, tries, null);
        }

        /** The result of the last try. */
        Input.ExecutorResult finish(Try t) {
            Map<String, Object> d = new LinkedHashMap<>();
            d.put("method", action.method());
            d.put("tries", t.tries());
            if (t.detail() != null) d.putAll(t.detail());
            return result(call, t.ok(), t.message(), d);
        }
    }

    private static Input.ExecutorResult result(Effect.CallExecutor c, boolean ok, String message, Map<String, Object> detail) {
        return new Input.ExecutorResult(c.runId(), c.stepId(), c.attempt(), ok, message, List.of(), detail);
    }

    @Override
    public void close() {
        pauses.shutdownNow();
    }
}
