package dev.tend.demo;

import dev.tend.serve.TimeScale;

import java.io.IOException;
import java.io.PrintWriter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * Plays the demo's scripted incidents into a running server over its HTTP API, as a health
 * pipeline would: round after round, each transition at its scripted demo time (the server's
 * accelerated processing clock), stamped with that time. Runs on its own daemon thread until
 * {@link #close()}; a transition the server refuses is written to the log and the script goes on.
 */
public final class DemoFeeder implements AutoCloseable {
    private final URI transitions;
    private final String token;
    private final TimeScale scale;
    private final Instant firstRound;
    private final List<DemoScript.Incident> incidents;
    private final PrintWriter log;
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
            .connectTimeout(Duration.ofSeconds(5)).build();
    private final AtomicInteger sent = new AtomicInteger();
    private final ScheduledExecutorService timer = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "tend-demo-script");
        t.setDaemon(true);
        return t;
    });

    /**
     * @param serverUrl  the server's base URL, e.g. {@code http://127.0.0.1:7420}
     * @param token      a token with the operator role
     * @param scale      the server's time scale: demo times are its processing times
     * @param firstRound the demo time at which round 0 begins
     */
    public DemoFeeder(String serverUrl, String token, TimeScale scale, Instant firstRound, List<DemoScript.Incident> incidents,
                      PrintWriter log) {
        this.transitions = URI.create(Objects.requireNonNull(serverUrl, "serverUrl") + "/api/v1/transitions");
        this.token = Objects.requireNonNull(token, "token");
        this.scale = Objects.requireNonNull(scale, "scale");
        this.firstRound = Objects.requireNonNull(firstRound, "firstRound");
        this.incidents = List.copyOf(incidents);
        this.log = Objects.requireNonNull(log, "log");
    }

    /** Schedules round 0; each round schedules the next. */
    public void start() {
        schedule(0);
    }

    /** How many transitions the server accepted so far. */
    public int accepted() {
        return sent.get();
    }

    private void schedule(int round) {
        Instant start = firstRound.plus(DemoScript.ROUND.multipliedBy(round));
        for (DemoScript.Scripted s : DemoScript.round(incidents, round)) {
            Instant at = start.plus(s.after());
            timer.schedule(() -> send(s, at), wallDelayMillis(at), TimeUnit.MILLISECONDS);
        }
        Instant next = start.plus(DemoScript.ROUND);
        timer.schedule(() -> schedule(round + 1), wallDelayMillis(next), TimeUnit.MILLISECONDS);
    }

    private long wallDelayMillis(Instant demoTime) {
        // the wall clock is what the scheduler waits on; the demo times map onto it through the scale
        return Math.max(0, Duration.between(Instant.now(), scale.wallTimeOf(demoTime)).toMillis());
    }

    private void send(DemoScript.Scripted s, Instant at) {
        String line = "{\"at\":\"" + at + "\",\"cluster\":\"" + s.target().cluster() + "\",\"node\":\"" + s.target().node()
                + "\",\"signal\":\"" + s.signal() + "\",\"state\":\"" + s.state() + "\"}";
        HttpRequest request = HttpRequest.newBuilder(transitions).timeout(Duration.ofSeconds(30))
                .header("Authorization", "Bearer " + token).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(line)).build();
        try {
            HttpResponse<String> r = http.send(request, HttpResponse.BodyHandlers.ofString());
            if (r.statusCode() == 200) {
                sent.incrementAndGet();
            } else {
                note("the server refused a scripted transition of " + s.incident() + " (" + r.statusCode() + "): " + r.body());
            }
        } catch (IOException e) {
            note("could not send a scripted transition of " + s.incident() + ": " + e.getMessage());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    private void note(String message) {
        synchronized (log) {
            log.println("tend demo: " + message);
            log.flush();
        }
    }

    /** Stops the script; transitions not sent yet are dropped. Idempotent. */
    @Override
    public void close() {
        timer.shutdownNow();
    }
}
