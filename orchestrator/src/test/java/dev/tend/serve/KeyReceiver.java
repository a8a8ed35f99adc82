package dev.tend.serve;

import com.sun.net.httpserver.HttpServer;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A loopback HTTP receiver for the http executor that de-duplicates by {@code Idempotency-Key},
 * as a receiver of tend's calls should: the first request of a key is done (after a pause, so
 * calls are in flight when a leader dies), a later one of the same key is answered as done
 * and counted as a repeat.
 */
final class KeyReceiver implements AutoCloseable {
    private final HttpServer server;
    private final Set<String> done = new LinkedHashSet<>();
    private final AtomicLong repeats = new AtomicLong();

    private KeyReceiver(Duration work) throws IOException {
        server = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 64);
        server.setExecutor(Executors.newFixedThreadPool(16));
        server.createContext("/", exchange -> {
            String key = exchange.getRequestHeaders().getFirst("Idempotency-Key");
            exchange.getRequestBody().readAllBytes();
            int status = 200;
            if (key == null) {
                status = 400;
            } else {
                boolean first;
                synchronized (done) {
                    first = !done.contains(key);
                }
                if (first) {
                    try {
                        Thread.sleep(work.toMillis());
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                    synchronized (done) {
                        if (!done.add(key)) repeats.incrementAndGet();
                    }
                } else {
                    repeats.incrementAndGet();
                }
            }
            byte[] body = ("{\"key\":\"" + key + "\"}").getBytes(StandardCharsets.UTF_8);
            exchange.sendResponseHeaders(status, body.length);
            try (OutputStream out = exchange.getResponseBody()) {
                out.write(body);
            }
        });
        server.start();
    }

    static KeyReceiver start(Duration work) throws IOException {
        return new KeyReceiver(work);
    }

    String url() {
        return "http://127.0.0.1:" + server.getAddress().getPort();
    }

    /** Keys done, in the order first done. */
    List<String> done() {
        synchronized (done) {
            return List.copyOf(done);
        }
    }

    /** Requests of a key already done (asked again after a takeover), answered without doing it again. */
    long repeats() {
        return repeats.get();
    }

    @Override
    public void close() {
        server.stop(0);
    }
}
