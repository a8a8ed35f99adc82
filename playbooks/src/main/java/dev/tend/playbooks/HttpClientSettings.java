package dev.tend.playbooks;

import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeMap;
import java.util.regex.Pattern;

/**
 * How tend makes an outgoing HTTP call, shared by {@code http} actions and {@code webhook}
 * channels: extra headers, a bearer token read from a file (read again whenever the file
 * changes; its value is never logged or ledgered), a CA bundle to trust instead of the
 * JDK's, and a client certificate and key for mutual TLS. Paths are absolute (the readers
 * resolve them against the file they were written in). Immutable.
 *
 * @param headers         extra request headers, by name; never one tend sets itself
 * @param bearerTokenFile a file holding the token, or null
 * @param caBundle        PEM certificates to trust, or null for the JDK's trust store
 * @param clientCert      PEM certificate chain for mutual TLS, or null; given together with {@code clientKey}
 * @param clientKey       PEM PKCS#8 private key for mutual TLS, or null
 */
public record HttpClientSettings(Map<String, String> headers, Path bearerTokenFile, Path caBundle, Path clientCert,
                                 Path clientKey) {
    /** Headers tend writes itself (lower case); a configured header may not replace them. */
    public static final Set<String> RESERVED_HEADERS = Set.of("idempotency-key", "content-type", "content-length", "host",
            "connection", "expect", "upgrade", "authorization");
    private static final Pattern HEADER_NAME = Pattern.compile("[A-Za-z0-9!#$%&'*+.^_`|~-]+");
    private static final HttpClientSettings NONE = new HttpClientSettings(Map.of(), null, null, null, null);

    public HttpClientSettings {
        Map<String, String> h = new TreeMap<>(String.CASE_INSENSITIVE_ORDER);
        for (Map.Entry<String, String> e : Objects.requireNonNull(headers, "headers").entrySet()) {
            checkHeader(e.getKey(), e.getValue());
            if (h.put(e.getKey(), e.getValue()) != null) {
                throw new IllegalArgumentException("header '" + e.getKey() + "' is given twice (header names ignore case)");
            }
        }
        headers = java.util.Collections.unmodifiableMap(new TreeMap<>(h));
        if ((clientCert == null) != (clientKey == null)) {
            throw new IllegalArgumentException("client-cert and client-key go together: mutual TLS needs the certificate and its key");
        }
        for (Path p : new Path[] {bearerTokenFile, caBundle, clientCert, clientKey}) {
            if (p != null && !p.isAbsolute()) throw new IllegalArgumentException("path " + p + " must be absolute here");
        }
    }

    /** No extra header, no token, the JDK's trust store, no client certificate. */
    public static HttpClientSettings none() {
        return NONE;
    }

    /** True when TLS needs more than the JDK's defaults (a CA bundle or a client certificate). */
    public boolean hasTls() {
        return caBundle != null || clientCert != null;
    }

    /**
     * Checks one configured header; throws {@link IllegalArgumentException} naming the rule.
     */
    public static void checkHeader(String name, String value) {
        if (name == null || !HEADER_NAME.matcher(name).matches()) {
            throw new IllegalArgumentException("header name '" + name + "' is not a valid HTTP header name (RFC 9110 token)");
        }
        if (RESERVED_HEADERS.contains(name.toLowerCase(Locale.ROOT))) {
            throw new IllegalArgumentException("header '" + name + "' is set by tend itself"
                    + ("authorization".equalsIgnoreCase(name) ? "; give a bearer token with bearer-token-file, never in the configuration" : ""));
        }
        if (value == null || value.chars().anyMatch(c -> c == '\r' || c == '\n' || c == 0)) {
            throw new IllegalArgumentException("header '" + name + "' needs a one-line value");
        }
    }
}
