package dev.tend.serve;

import dev.tend.api.auth.Tokens;
import dev.tend.engine.EngineSetup;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;

/**
 * How a {@link TendServer} runs. Build with {@link #builder(EngineSetup)}; every field has an
 * explicit default there, and {@link Builder#build()} rejects values out of range.
 *
 * @param host           address to listen on (default 127.0.0.1)
 * @param port           port to listen on, 0 for any free one (default 7420)
 * @param tokens         the bearer tokens accepted (default none: every API route answers 401)
 * @param speedup        simulated actions run this many times faster than their durations (default 1)
 * @param seed           seed of simulated outcomes (default 1)
 * @param tick           how often processing time is fed to the engine when nothing else happens (default 5s)
 * @param commandTimeout how long a request waits for its command to be committed (default 30s)
 * @param workDir        working directory of command actions (default: the current directory)
 * @param log            where notifications and failures are written (default: standard error)
 * @param timeScale      how processing time relates to the wall clock (default {@link TimeScale#real()})
 * @param allowHosts     names the server answers to besides loopback and the address listened on (default none)
 * @param wrongTokens    wrong tokens one address may send a minute before it is answered 429 (default 10)
 * @param tls            the certificate and key to listen with over HTTPS, or null for plain HTTP (default null)
 * @param snapshots      when snapshots of the engine are written (default
 *                       {@link dev.tend.runtime.Orchestrator#DEFAULT_SNAPSHOTS})
 * @param stream         the topic transitions are consumed from while this instance leads, or null for none (default null)
 */
public record ServeSettings(EngineSetup setup, String host, int port, Tokens tokens, double speedup, long seed,
                            Duration tick, Duration commandTimeout, Path workDir, PrintWriter log, TimeScale timeScale,
                            java.util.List<String> allowHosts, int wrongTokens, TlsFiles tls, dev.tend.runtime.SnapshotPolicy snapshots,
                            dev.tend.stream.StreamSource stream) {
    public static final int DEFAULT_PORT = 7420;

    public ServeSettings {
        Objects.requireNonNull(setup, "setup");
        Objects.requireNonNull(host, "host");
        if (port < 0 || port > 65535) throw new IllegalArgumentException("port must be between 0 and 65535, got " + port);
        Objects.requireNonNull(tokens, "tokens");
        if (!(speedup > 0)) throw new IllegalArgumentException("speedup must be above 0, got " + speedup);
        requirePositive(tick, "tick");
        requirePositive(commandTimeout, "commandTimeout");
        Objects.requireNonNull(workDir, "workDir");
        Objects.requireNonNull(log, "log");
        Objects.requireNonNull(timeScale, "timeScale");
        allowHosts = java.util.List.copyOf(allowHosts);
        if (wrongTokens < 1) throw new IllegalArgumentException("wrongTokens must be at least 1, got " + wrongTokens);
        Objects.requireNonNull(snapshots, "snapshots");
    }

    private static void requirePositive(Duration d, String field) {
        Objects.requireNonNull(d, field);
        if (d.isNegative() || d.isZero()) throw new IllegalArgumentException(field + " must be longer than zero, got " + d);
    }

    public static Builder builder(EngineSetup setup) {
        return new Builder(setup);
    }

    /** Collects settings; {@link #build()} validates them. */
    public static final class Builder {
        private final EngineSetup setup;
        private String host = "127.0.0.1";
        private int port = DEFAULT_PORT;
        private Tokens tokens = Tokens.none();
        private double speedup = 1;
        private long seed = 1;
        private dev.tend.runtime.SnapshotPolicy snapshots = dev.tend.runtime.Orchestrator.DEFAULT_SNAPSHOTS;
        private Duration tick = Duration.ofSeconds(5);
        private Duration commandTimeout = Duration.ofSeconds(30);
        private Path workDir = Path.of("").toAbsolutePath();
        private PrintWriter log = new PrintWriter(System.err, true);
        private TimeScale timeScale = TimeScale.real();
        private java.util.List<String> allowHosts = java.util.List.of();
        private int wrongTokens = dev.tend.api.auth.FailedTokens.LIMIT;
        private TlsFiles tls;
        private dev.tend.stream.StreamSource stream;

        private Builder(EngineSetup setup) {
            this.setup = setup;
        }

        public Builder listen(String newHost, int newPort) {
            this.host = newHost;
            this.port = newPort;
            return this;
        }

        public Builder tokens(Tokens value) {
            this.tokens = value;
            return this;
        }

        public Builder speedup(double value) {
            this.speedup = value;
            return this;
        }

        public Builder seed(long value) {
            this.seed = value;
            return this;
        }

        public Builder tick(Duration value) {
            this.tick = value;
            return this;
        }

        public Builder commandTimeout(Duration value) {
            this.commandTimeout = value;
            return this;
        }

        public Builder workDir(Path value) {
            this.workDir = value;
            return this;
        }

        public Builder log(PrintWriter value) {
            this.log = value;
            return this;
        }

        public Builder timeScale(TimeScale value) {
            this.timeScale = value;
            return this;
        }

        public Builder snapshots(dev.tend.runtime.SnapshotPolicy value) {
            this.snapshots = value;
            return this;
        }

        public Builder allowHosts(java.util.List<String> value) {
            this.allowHosts = value;
            return this;
        }

        public Builder wrongTokens(int value) {
            this.wrongTokens = value;
            return this;
        }

        public Builder tls(TlsFiles value) {
            this.tls = value;
            return this;
        }

        public Builder stream(dev.tend.stream.StreamSource value) {
            this.stream = value;
            return this;
        }

        public ServeSettings build() {
            return new ServeSettings(setup, host, port, tokens, speedup, seed, tick, commandTimeout, workDir, log, timeScale,
                    allowHosts, wrongTokens, tls, snapshots, stream);
        }
    }
}
