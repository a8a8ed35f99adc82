package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.net.URI;
import java.time.Duration;
import java.util.Objects;

/**
 * POSTs each page as JSON to {@code url}, with the header {@code Idempotency-Key} set to the
 * page's stable id so that the receiver can drop a repeat. A 2xx answer is delivery; a 5xx
 * answer or a failed connection is tried again within the attempt after {@code backoff},
 * doubling, up to {@code retries} times; any other answer refuses the page for good.
 *
 * @param body    the JSON body with page placeholders; empty means every field of the page
 * @param timeout limit of one try
 * @param client  headers, bearer token, CA bundle and client certificate (shared with http actions)
 */
public record WebhookChannel(Id name, URI url, JsonTemplate body, Duration timeout, int retries, Duration backoff,
                             HttpClientSettings client, Duration giveUpAfter) implements ChannelDef {
    public static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(10);
    public static final int DEFAULT_RETRIES = 3;
    public static final Duration DEFAULT_BACKOFF = Duration.ofSeconds(1);

    public WebhookChannel {
        Objects.requireNonNull(name, "channel name");
        Objects.requireNonNull(url, "channel " + name + " url");
        if (!("http".equals(url.getScheme()) || "https".equals(url.getScheme())) || url.getHost() == null) {
            throw new IllegalArgumentException("channel " + name + " url must be an absolute http:// or https:// URL with a host, got '" + url + "'");
        }
        body = body == null ? new JsonTemplate(null) : body;
        timeout = timeout == null ? DEFAULT_TIMEOUT : timeout;
        if (timeout.isNegative() || timeout.isZero()) throw new IllegalArgumentException("channel " + name + " timeout must be longer than zero");
        if (retries < 0 || retries > 10) throw new IllegalArgumentException("channel " + name + " retries must be between 0 and 10, got " + retries);
        backoff = backoff == null ? DEFAULT_BACKOFF : backoff;
        if (backoff.isNegative() || backoff.isZero()) throw new IllegalArgumentException("channel " + name + " backoff must be longer than zero");
        client = client == null ? HttpClientSettings.none() : client;
        giveUpAfter = giveUpAfter == null ? DEFAULT_GIVE_UP_AFTER : giveUpAfter;
        ChannelDef.checkGiveUp(name, giveUpAfter);
    }

    @Override
    public String kind() {
        return "webhook";
    }
}
