package dev.tend.page;

import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;
import com.sun.net.httpserver.HttpsConfigurator;
import com.sun.net.httpserver.HttpsParameters;
import com.sun.net.httpserver.HttpsServer;

import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLSession;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * A page receiver for tests, on loopback (port 0): logs every request's idempotency key,
 * headers and body; answers 503 to the first {@code failFirst} requests of each key, and
 * slowly when asked; accepts each key once (a repeat is answered 200 "duplicate" and not
 * counted again), as a receiver that drops repeats by id does. Over HTTPS with a client
 * certificate required when built with an {@link SSLContext}.
 */
final class PageReceiver implements AutoCloseable {
    record Request(String key, Map<String, String> headers, String body, String clientSubject) {
    }

    private final HttpServer server;
    private final List<Request> requests = java.util.Collections.synchronizedList(new ArrayList<>());
    private final Map<String, AtomicInteger> seen = new ConcurrentHashMap<>();
    private final Map<String, Integer> accepted = new ConcurrentHashMap<>();
    private volatile int failFirst;
    private volatile Duration delay = Duration.ZERO;
    private volatile int status = 200;
    private volatile CountDownLatch hold;

    private PageReceiver(HttpServer server) {
        this.server = server;
        server.createContext("/", this::handle);
        server.setExecutor(Executors.newCachedThreadPool());
        server.start();
    }

    static PageReceiver http() {
        try {
            return new PageReceiver(HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** An HTTPS receiver that requires a client certificate trusted by {@code tls}. */
    static PageReceiver https(SSLContext tls) {
        try {
            HttpsServer s = HttpsServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
            s.setHttpsConfigurator(new HttpsConfigurator(tls) {
                @Override
                public void configure(HttpsParameters params) {
                    javax.net.ssl.SSLParameters p = tls.getDefaultSSLParameters();
                    p.setNeedClientAuth(true);
                    params.setSSLParameters(p);
                }
            });
            return new PageReceiver(s);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    PageReceiver failFirst(int n) {
        failFirst = n;
        return this;
    }

    PageReceiver delay(Duration d) {
        delay = d;
        return this;
    }

    /** Every request is answered with this status (after the failures). */
    PageReceiver status(int s) {
        status = s;
        return this;
    }

    /** Requests wait (unanswered) until {@link #release()}. */
    PageReceiver holdRequests() {
        hold = new CountDownLatch(1);
        return this;
    }

    void release() {
        CountDownLatch h = hold;
        hold = null;
        if (h != null) h.countDown();
    }

    String url() {
        String scheme = server instanceof HttpsServer ? "https" : "http";
        return scheme + "://127.0.0.1:" + server.getAddress().getPort() + "/pages";
    }

    List<Request> requests() {
        synchronized (requests) {
            return List.copyOf(requests);
        }
    }

    /** How many times each key was accepted (always 1 for an accepted key: repeats are dropped). */
    Map<String, Integer> accepted() {
        return Map.copyOf(accepted);
    }

    private void handle(HttpExchange ex) throws IOException {
        try (ex) {
            String body = new String(ex.getRequestBody().readAllBytes(), StandardCharsets.UTF_8);
            String key = ex.getRequestHeaders().getFirst("Idempotency-Key");
            Map<String, String> headers = new LinkedHashMap<>();
            ex.getRequestHeaders().forEach((k, v) -> headers.put(k.toLowerCase(java.util.Locale.ROOT), String.join(",", v)));
            String subject = null;
            if (ex instanceof com.sun.net.httpserver.HttpsExchange https) {
                SSLSession session = https.getSSLSession();
                try {
                    subject = ((java.security.cert.X509Certificate) session.getPeerCertificates()[0]).getSubjectX500Principal().getName();
                } catch (javax.net.ssl.SSLPeerUnverifiedException e) {
                    subject = null;
                }
            }
            requests.add(new Request(key, headers, body, subject));
            CountDownLatch h = hold;
            if (h != null) h.await();
            if (!delay.isZero()) Thread.sleep(delay.toMillis());
            int n = seen.computeIfAbsent(String.valueOf(key), k -> new AtomicInteger()).incrementAndGet();
            int answer = n <= failFirst ? 503 : status;
            String text = n <= failFirst ? "busy, try again" : answer >= 200 && answer < 300
                    ? (accepted.putIfAbsent(String.valueOf(key), 1) == null ? "accepted" : "duplicate") : "refused";
            byte[] out = text.getBytes(StandardCharsets.UTF_8);
            ex.sendResponseHeaders(answer, out.length);
            ex.getResponseBody().write(out);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    @Override
    public void close() {
        release();
        server.stop(0);
    }
}
