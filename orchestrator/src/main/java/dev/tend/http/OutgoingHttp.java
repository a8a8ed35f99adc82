package dev.tend.http;

import dev.tend.playbooks.HttpClientSettings;
import dev.tend.shared.TendException;

import javax.net.ssl.KeyManagerFactory;
import javax.net.ssl.SSLContext;
import javax.net.ssl.TrustManagerFactory;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.security.GeneralSecurityException;
import java.security.KeyStore;
import java.security.PrivateKey;
import java.security.cert.Certificate;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

/**
 * The outgoing HTTP clients of tend ({@code http} actions and {@code webhook} channels), one
 * per distinct {@link HttpClientSettings}: trust from the CA bundle (else the JDK's), the
 * client certificate and key for mutual TLS, and per request the configured headers and the
 * bearer token (read again when its file changes). {@link #check} reads every file at start,
 * so a missing file, a bad PEM or a key file readable by others stops tend before it serves.
 * Thread-safe.
 */
public final class OutgoingHttp {
    private final Map<HttpClientSettings, HttpClient> clients = new ConcurrentHashMap<>();
    private final Map<java.nio.file.Path, BearerToken> tokens = new ConcurrentHashMap<>();

    /**
     * Reads and checks the files of {@code settings} now (and keeps the client it builds).
     * Throws {@link TendException} naming the file and the problem.
     */
    public void check(HttpClientSettings settings) {
        client(settings);
        if (settings.bearerTokenFile() != null) token(settings.bearerTokenFile());
    }

    /** The client for these settings, built on first use. */
    public HttpClient client(HttpClientSettings settings) {
        return clients.computeIfAbsent(settings, OutgoingHttp::build);
    }

    /** Adds the configured headers and the bearer token to {@code request}. */
    public HttpRequest.Builder authorize(HttpRequest.Builder request, HttpClientSettings settings) {
        settings.headers().forEach(request::header);
        if (settings.bearerTokenFile() != null) request.header("Authorization", "Bearer " + token(settings.bearerTokenFile()).value());
        return request;
    }

    private BearerToken token(java.nio.file.Path file) {
        return tokens.computeIfAbsent(file, BearerToken::new);
    }

    private static HttpClient build(HttpClientSettings s) {
        HttpClient.Builder b = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
                .followRedirects(HttpClient.Redirect.NEVER).connectTimeout(Duration.ofSeconds(10));
        if (s.hasTls()) b.sslContext(sslContext(s));
        return b.build();
    }

    /**
     * Trust in the PEM certificates of {@code caBundle} only, or in the JDK's trust store when
     * it is null; {@code what} names the file in a message (a {@link TendException}).
     */
    public static TrustManagerFactory trust(java.nio.file.Path caBundle, String what) {
        try {
            TrustManagerFactory tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
            if (caBundle == null) {
                tmf.init((KeyStore) null);
                return tmf;
            }
            KeyStore trust = KeyStore.getInstance("PKCS12");
            trust.load(null, null);
            int i = 0;
            for (Certificate c : PemFiles.certificates(caBundle, what)) trust.setCertificateEntry("ca-" + i++, c);
            tmf.init(trust);
            return tmf;
        } catch (GeneralSecurityException | java.io.IOException e) {
            throw new TendException("cannot trust the certificates of " + what + " " + caBundle + ": " + e.getMessage(), e);
        }
    }

    private static SSLContext sslContext(HttpClientSettings s) {
        try {
            TrustManagerFactory tmf = trust(s.caBundle(), "ca-bundle");
            KeyManagerFactory kmf = null;
            if (s.clientCert() != null) {
                PrivateFiles.check(s.clientKey(), "client-key");
                List<Certificate> chain = PemFiles.certificates(s.clientCert(), "client-cert");
                PrivateKey key = PemFiles.privateKey(s.clientKey(), "client-key");
                char[] pass = new char[0];
                KeyStore ks = KeyStore.getInstance("PKCS12");
                ks.load(null, null);
                ks.setKeyEntry("client", key, pass, chain.toArray(new Certificate[0]));
                kmf = KeyManagerFactory.getInstance(KeyManagerFactory.getDefaultAlgorithm());
                kmf.init(ks, pass);
            }
            SSLContext ctx = SSLContext.getInstance("TLS");
            ctx.init(kmf == null ? null : kmf.getKeyManagers(), tmf.getTrustManagers(), null);
            return ctx;
        } catch (GeneralSecurityException | java.io.IOException e) {
            throw new TendException("cannot set up TLS for an outgoing call (ca-bundle " + s.caBundle() + ", client-cert "
                    + s.clientCert() + "): " + e.getMessage(), e);
        }
    }
}
