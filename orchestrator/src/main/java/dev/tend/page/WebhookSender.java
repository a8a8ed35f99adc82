package dev.tend.page;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.http.OutgoingHttp;
import dev.tend.playbooks.WebhookChannel;
import io.github.resilience4j.core.IntervalFunction;
import io.github.resilience4j.retry.Retry;
import io.github.resilience4j.retry.RetryConfig;

import java.io.IOException;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.net.http.HttpTimeoutException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;

/**
 * POSTs a page as JSON (the channel's body template, or every field of the page) with
 * {@code Idempotency-Key: <page id>}, the configured headers and bearer token. A 2xx answer
 * is delivery. A 5xx, 408 or 429 answer, a timeout or a failed connection is tried again
 * with the same key after the channel's backoff, doubling (at most 30 s), up to its
 * {@code retries} (resilience4j's retry); any other answer refuses the page.
 */
public final class WebhookSender implements PageSender {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int ANSWER_LIMIT = 512;
    private final WebhookChannel channel;
    private final OutgoingHttp http;
    private final Retry retry;

    public WebhookSender(WebhookChannel channel, OutgoingHttp http) {
        this.channel = channel;
        this.http = http;
        RetryConfig config = RetryConfig.<Answer>custom()
                .maxAttempts(channel.retries() + 1)
                .intervalFunction(IntervalFunction.ofExponentialBackoff(channel.backoff(), 2.0, Duration.ofSeconds(30)))
                .retryOnResult(a -> a.outcome() == Answer.Outcome.RETRY)
                .failAfterMaxAttempts(false)
                .build();
        this.retry = Retry.of("webhook-" + channel.name(), config);
    }

    @Override
    public String kind() {
        return "webhook";
    }

    @Override
    public Answer send(Page page) {
        byte[] body;
        try {
            Map<String, Object> b = channel.body().isEmpty() ? page.fields() : channel.body().render(page.placeholders());
            body = JSON.writeValueAsBytes(b);
        } catch (JsonProcessingException e) {
            return Answer.refused("could not build the body: " + e.getMessage());
        }
        List<String> tries = Collections.synchronizedList(new ArrayList<>());
        Answer last = retry.executeSupplier(() -> {
            Answer a = once(page, body);
            tries.add(a.text());
            return a;
        });
        return last.withTries(tries);
    }

    private Answer once(Page page, byte[] body) {
        HttpRequest request;
        try {
            request = http.authorize(HttpRequest.newBuilder(channel.url()).timeout(channel.timeout()), channel.client())
                    .header("Idempotency-Key", page.id())
                    .header("Content-Type", "application/json")
                    .POST(HttpRequest.BodyPublishers.ofByteArray(body)).build();
        } catch (RuntimeException e) {
            return Answer.retry("could not build the request: " + e.getMessage());
        }
        try {
            HttpResponse<byte[]> r = http.client(channel.client()).send(request, HttpResponse.BodyHandlers.ofByteArray());
            int status = r.statusCode();
            String text = new String(r.body(), 0, Math.min(r.body().length, ANSWER_LIMIT), StandardCharsets.UTF_8).strip();
            String answer = "HTTP " + status + (text.isEmpty() ? "" : ": " + text);
            if (status >= 200 && status < 300) return Answer.accepted(answer);
            if (status >= 500 || status == 408 || status == 429) return Answer.retry(answer);
            return Answer.refused(answer);
        } catch (HttpTimeoutException e) {
            return Answer.retry("no answer within " + channel.timeout().toMillis() + " ms");
        } catch (IOException e) {
            return Answer.retry("could not reach " + channel.url().getHost() + ":" + channel.url().getPort() + ": " + e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return Answer.retry("interrupted");
        }
    }
}
