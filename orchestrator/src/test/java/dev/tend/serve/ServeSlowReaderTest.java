package dev.tend.serve;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.net.Socket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.atomic.AtomicLong;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static dev.tend.serve.ServeFixture.OLGA;
import static org.assertj.core.api.Assertions.assertThat;

/**
 * A client that posts transitions and never reads its answers must not hold up anyone else's
 * answer. Answers are written once their commit is done, on the answering threads
 * ({@code tend-answer}, a pool that takes a new thread when all are busy): such a client holds
 * the thread blocked writing to it, and the next commit's answers go out on another. This
 * checks the behaviour, whatever the design: the client's answers fill its socket, then another
 * client posts.
 */
class ServeSlowReaderTest {
    private static final Pattern RECEIVED = Pattern.compile("(?m)^tend_transitions_received_total(?:\\{[^}]*})? ([0-9.eE+]+)$");

    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture();

    @Test
    void aClientThatNeverReadsItsAnswersDoesNotHoldUpAnotherClientsAnswer() throws Exception {
        serve.start(dir);
        URI base = URI.create(serve.server().url());
        AtomicLong sent = new AtomicLong();
        try (Socket hostile = new Socket()) {
            hostile.setReceiveBufferSize(4096); // its answers fill the socket's buffers sooner
            hostile.connect(new java.net.InetSocketAddress(base.getHost(), base.getPort()));
            Thread writer = new Thread(() -> pipelineForever(hostile, base, sent), "hostile-writer");
            writer.setDaemon(true);
            writer.start();
            // the server stops taking this connection's requests once an answer cannot be sent whole:
            // the count of received transitions stands still while the writer still has requests to send
            long[] last = {-1};
            long[] since = {System.nanoTime()};
            ServeFixture.awaitTrue("the server has answers to the hostile client that the client does not read", Duration.ofSeconds(90), () -> {
                long now = received();
                if (now != last[0]) {
                    last[0] = now;
                    since[0] = System.nanoTime();
                    return false;
                }
                return now > 0 && System.nanoTime() - since[0] > 1_500_000_000L;
            });
            assertThat(sent.get()).as("the writer sent more requests than were answered").isGreaterThan(last[0]);

            HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
            HttpRequest req = HttpRequest.newBuilder(base.resolve("/api/v1/transitions"))
                    .header("Authorization", "Bearer " + OLGA)
                    .POST(HttpRequest.BodyPublishers.ofString(ServeFixture.transition("dispatch-1", "n1", "heartbeat", "clear")))
                    // a bound on liveness, not a timing figure: a held answer thread waits for Jetty's idle timeout (30 s)
                    .timeout(Duration.ofSeconds(15)).build();
            HttpResponse<String> answer = http.send(req, HttpResponse.BodyHandlers.ofString());
            assertThat(answer.statusCode()).as(answer.body()).isEqualTo(200);
            assertThat(answer.body()).isEqualTo("{\"accepted\":1,\"rejected\":0,\"problems\":[]}");
        }
    }

    /** Writes one-line POSTs on {@code s}, one after another, without reading anything, until the socket fails. */
    private static void pipelineForever(Socket s, URI base, AtomicLong sent) {
        try {
            OutputStream out = s.getOutputStream();
            for (long i = 0; ; i++) {
                String line = ServeFixture.transition("fares-3", "n" + (1 + i % 3), "heartbeat", i % 2 == 0 ? "clear" : "silent");
                byte[] body = line.getBytes(StandardCharsets.UTF_8);
                String head = "POST /api/v1/transitions HTTP/1.1\r\nHost: " + base.getHost() + ":" + base.getPort()
                        + "\r\nAuthorization: Bearer " + OLGA + "\r\nContent-Type: application/json\r\nContent-Length: "
                        + body.length + "\r\n\r\n";
                out.write(head.getBytes(StandardCharsets.US_ASCII));
                out.write(body);
                sent.incrementAndGet();
            }
        } catch (java.io.IOException closed) {
            // the test ended and closed the socket
        }
    }

    private long received() {
        Matcher m = RECEIVED.matcher(serve.get("/metrics", null).text());
        return m.find() ? (long) Double.parseDouble(m.group(1)) : 0;
    }
}
