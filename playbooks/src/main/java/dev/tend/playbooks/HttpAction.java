package dev.tend.playbooks;

import dev.tend.shared.Id;
import dev.tend.shared.JsonValues;

import java.time.Duration;
import java.util.Map;
import java.util.Objects;
import java.util.Set;

/**
 * Calls an HTTP endpoint with a JSON body and the idempotency key in a header.
 *
 * @param url     absolute http or https URL; may contain placeholders
 * @param method  one of {@link #METHODS}; POST by default
 * @param body    the JSON body: maps, lists, strings, numbers, booleans, null; placeholders
 *                are allowed in string values. Unmodifiable, never null (empty: no body)
 * @param timeout limit for one attempt, or null
 * @param retries transport-level retries within one attempt, with the same key, 0 to 10
 * @param client  headers, bearer token, CA bundle and client certificate of the call
 */
public record HttpAction(Id id, Template url, String method, Map<String, Object> body, Duration timeout, int retries,
                         HttpClientSettings client) implements ActionDef {
    public static final Set<String> METHODS = Set.of("POST", "PUT", "PATCH", "DELETE", "GET");

    public HttpAction {
        Objects.requireNonNull(id, "action id");
        Objects.requireNonNull(url, "action " + id + " url");
        if (!url.text().startsWith("http://") && !url.text().startsWith("https://")) {
            throw new IllegalArgumentException("action " + id + " url must start with http:// or https://, got '" + url + "'");
        }
        method = method == null ? "POST" : method;
        if (!METHODS.contains(method)) {
            throw new IllegalArgumentException("action " + id + " method must be one of DELETE, GET, PATCH, POST, PUT, got '" + method + "'");
        }
        body = body == null ? Map.of() : JsonValues.freeze(body);
        if (timeout != null && (timeout.isNegative() || timeout.isZero())) {
            throw new IllegalArgumentException("action " + id + " timeout must be longer than zero, got " + timeout);
        }
        if (retries < 0 || retries > 10) {
            throw new IllegalArgumentException("action " + id + " retries must be between 0 and 10, got " + retries);
        }
        client = client == null ? HttpClientSettings.none() : client;
    }

    /** An action with no extra client settings. */
    public HttpAction(Id id, Template url, String method, Map<String, Object> body, Duration timeout, int retries) {
        this(id, url, method, body, timeout, retries, HttpClientSettings.none());
    }

    @Override
    public String kind() {
        return "http";
    }

    @Override
    public boolean uses(String placeholder) {
        return url.uses(placeholder) || new JsonTemplate(body).uses(placeholder);
    }

    /** The body with placeholders in string values filled in. */
    public Map<String, Object> renderBody(Map<String, String> values) {
        return new JsonTemplate(body).render(values);
    }
}
