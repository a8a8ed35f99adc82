package dev.tend.executor;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.playbooks.HttpAction;
import io.github.resilience4j.core.IntervalFunction;

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
import java.util.concurrent.CompletionException;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;

/**
 * Calls an HTTP endpoint for an {@link HttpAction}: the action's method (POST by default)
 * with the rendered JSON body to the rendered URL, header {@code Idempotency-Key: <key>}.
 * A 2xx answer is success. A 5xx answer or a failed connection is tried again, with the
 * same key, after an exponentially growing pause, up to the action's {@code retries}; a
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
        new Attempt(call, action, uri, body, deadline, done).send(1);
    }

    /** One attempt of a step: the tries of one request, all with the call's idempotency key. */
    private final class Attempt {
        private final Effect.CallExecutor call;
        private final HttpAction action;
        private final URI uri;
        private final HttpRequest.BodyPublisher body;
        private final long deadline;
        private final Consumer<Input.ExecutorResult> done;

        Attempt(Effect.CallExecutor call, HttpAction action, URI uri, HttpRequest.BodyPublisher body, long deadline,
                Consumer<Input.ExecutorResult> done) {
            this.call = call;
            this.action = action;
            this.uri = uri;
            this.body = body;
            this.deadline = deadline;
            this.done = done;
        }

        void send(int tries) {
            Duration left = Duration.ofNanos(deadline - System.nanoTime());
            if (left.isNegative() || left.isZero()) {
                finish(false, "timed out after " + call.timeout().toMillis() + " ms (" + (tries - 1) + " tries)", tries - 1, null);
                return;
            }
            HttpRequest.Builder b;
            try {
                b = http.authorize(HttpRequest.newBuilder(uri).timeout(left), action.client())
                        .header("Idempotency-Key", call.key()).method(action.method(), body);
            } catch (RuntimeException e) {
                // a bearer token file that vanished or emptied: the message names the file, never the token
                finish(false, "could not build the request: " + e.getMessage(), tries - 1, null);
                return;
            }
            if (!action.body().isEmpty()) b.header("Content-Type", "application/json");
            http.client(action.client()).sendAsync(b.build(), info -> FirstBytes.subscriber(BODY_LIMIT)).whenComplete((response, failure) -> {
                if (failure != null) onFailure(tries, failure);
                else onResponse(tries, response);
            });
        }

        private void onResponse(int tries, HttpResponse<byte[]> response) {
            int status = response.statusCode();
            Map<String, Object> detail = new LinkedHashMap<>();
            detail.put("status", status);
            detail.put("response", FirstBytes.text(response.body()));
            if (status >= 200 && status < 300) {
                finish(true, "HTTP " + status, tries, detail);
            } else if (status >= 500 && tries <= action.retries()) {
                retry(tries);
            } else if (status >= 500) {
                finish(false, "HTTP " + status + " after " + tries + (tries == 1 ? " try" : " tries"), tries, detail);
            } else {
                finish(false, "HTTP " + status + " (not tried again: the receiver refused the request)", tries, detail);
            }
        }

        private void onFailure(int tries, Throwable failure) {
            Throwable cause = failure instanceof CompletionException && failure.getCause() != null ? failure.getCause() : failure;
            if (cause instanceof HttpTimeoutException) {
                finish(false, "timed out after " + call.timeout().toMillis() + " ms (" + tries + (tries == 1 ? " try)" : " tries)"),
                        tries, null);
            } else if (cause instanceof IOException && tries <= action.retries()) {
                retry(tries);
            } else {
                finish(false, "could not reach " + uri.getHost() + ":" + uri.getPort() + " after " + tries
                        + (tries == 1 ? " try: " : " tries: ") + cause, tries, null);
            }
        }

        private void retry(int tries) {
            pauses.schedule(() -> send(tries + 1), backoff.apply(tries), TimeUnit.MILLISECONDS);
        }

        private void finish(boolean ok, String message, int tries, Map<String, Object> detail) {
            Map<String, Object> d = new LinkedHashMap<>();
            d.put("method", action.method());
            d.put("tries", tries);
            if (detail != null) d.putAll(detail);
            done.accept(result(call, ok, message, d));
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
