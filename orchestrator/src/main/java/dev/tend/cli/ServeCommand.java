package dev.tend.cli;

import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.audit.LedgerKey;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.serve.LeaderLoop;
import dev.tend.engine.LedgerKind;
import dev.tend.serve.ServeSettings;
import dev.tend.serve.TendServer;
import dev.tend.serve.TlsFiles;
import picocli.CommandLine;
import dev.tend.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.concurrent.Callable;

/**
 * {@code tend serve}: the long-running orchestrator with the HTTP API, until a signal stops it.
 * Event time follows processing time, two minutes behind, so a problem is confirmed even when
 * no further transition arrives (see DEVELOPERS.md, "Two clocks").
 */
@Command(name = "serve", mixinStandardHelpOptions = true,
        description = "Run the orchestrator with the HTTP API (/api/v1), /metrics and the web console; "
                + "resume from the store; stop on SIGINT or SIGTERM.")
public final class ServeCommand implements Callable<Integer> {
    /** How far event time may trail processing time when transitions pause. */
    static final Duration EVENT_TIME_LAG = Duration.ofMinutes(2);

    @Spec
    CommandSpec spec;

    @Mixin
    PolicyOptions policy;

    @Mixin
    DbOption db;

    @Mixin
    SnapshotOption snapshots;

    @Mixin
    ListenOptions listenOptions;

    @Option(names = "--tokens", paramLabel = "FILE",
            description = "bearer tokens (YAML: name, roles, sha256 of the token); without it every API request is refused")
    Path tokensFile;

    @Mixin
    SimulationOptions simulation;

    @Mixin
    LedgerKeyOption ledgerKey;

    @Option(names = "--allow-host", paramLabel = "NAME",
            description = "a name clients reach the server by (the Host header) besides localhost and the address listened on;"
                    + " repeat for several")
    java.util.List<String> allowHosts = new java.util.ArrayList<>();

    @Option(names = "--lease", defaultValue = "6s", paramLabel = "DURATION",
            description = "with a PostgreSQL --db: how long the leader lease lasts unless renewed (renewed every third of it);"
                    + " a standby takes over once it lapsed (default: ${DEFAULT-VALUE})")
    String lease;

    @Option(names = "--advertise", paramLabel = "URL",
            description = "with a PostgreSQL --db: the URL other instances and clients reach this one at, named by standbys"
                    + " when they refuse writes (default: the address listened on)")
    String advertise;

    @Option(names = "--tls-cert", paramLabel = "FILE",
            description = "serve HTTPS with this PEM certificate chain (the server's first); read again when it changes")
    Path tlsCert;

    @Option(names = "--tls-key", paramLabel = "FILE",
            description = "the unencrypted PKCS#8 PEM key of --tls-cert (readable by its owner only); read again when it changes")
    Path tlsKey;

    @Option(names = "--tls-check-every", paramLabel = "D", defaultValue = "10s",
            description = "how often the TLS files are looked at for a change (default: ${DEFAULT-VALUE})")
    String tlsCheckEvery;

    @Option(names = "--kafka", paramLabel = "HOST:PORT",
            description = "consume transitions from --topic on these brokers (HOST:PORT, several separated by commas): each record's"
                    + " value is one wire line, as POST /api/v1/transitions takes; only the leader consumes")
    String kafka;

    @Option(names = "--topic", paramLabel = "TOPIC", description = "with --kafka: the topic to consume (every partition)")
    String topic;

    @Option(names = "--group", paramLabel = "GROUP", defaultValue = dev.tend.stream.StreamSource.DEFAULT_GROUP,
            description = "with --kafka: the consumer group the positions are reported to; tend seeks to the offsets kept in"
                    + " --db (default: ${DEFAULT-VALUE})")
    String group;

    @Option(names = "--insecure-http",
            description = "allow plain HTTP on an address other than loopback (bearer tokens then cross the network in clear text)")
    boolean insecureHttp;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = spec.commandLine().getErr();
        Listen listen = listenOptions.resolve();
        if ((tlsCert == null) != (tlsKey == null)) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--tls-cert and --tls-key go together; give both or neither");
        }
        Duration checkEvery;
        try {
            checkEvery = dev.tend.shared.time.Durations.parse(tlsCheckEvery);
        } catch (IllegalArgumentException e) {
            throw new CommandLine.ParameterException(spec.commandLine(), "--tls-check-every: " + e.getMessage());
        }
        if (checkEvery.isZero()) throw new CommandLine.ParameterException(spec.commandLine(), "--tls-check-every must be longer than 0s");
        dev.tend.stream.StreamSource stream = stream();
        String warning = ListenSecurity.check(listen, tlsCert != null, insecureHttp);
        if (warning != null) err.println(warning);
        EngineSetup setup = policy.setup(EventTimeMode.following(EVENT_TIME_LAG));
        Tokens tokens = tokensFile == null ? Tokens.none() : TokenFile.load(tokensFile);
        LedgerKey key = ledgerKey.load();
        if (tokens.isEmpty()) err.println("tend: no --tokens given: every API request will be refused (401)");
        Clock clock = Clock.systemUTC();
        ServeSettings settings = ServeSettings.builder(setup).listen(listen.host(), listen.port()).tokens(tokens)
                .speedup(simulation.speedup).seed(simulation.seed).log(err).allowHosts(allowHosts).snapshots(snapshots.policy())
                .tls(tlsCert == null ? null : new TlsFiles(tlsCert, tlsKey, checkEvery)).stream(stream).build();
        if (db.address().isPostgres()) return serveShared(err, settings, listen, tokens, key, setup, clock);
        try (Store store = db.open()) {
            store.useTransaction(tx -> tx.appendLedger(clock.instant(), LedgerKind.POLICY_LOADED.wire(), PolicyOptions.loaded(setup)));
            try (TendServer server = TendServer.start(store, settings)) {
                if (key != null) server.checkpointWith(store, key);
                var rec = server.recovery();
                if (rec.inputsReplayed() > 0 || rec.snapshotSeq() > 0) {
                    err.println("tend: resumed from " + db.describe() + ": " + rec.describe());
                }
                StopLine stopped = new StopLine(err, "tend: stopped; everything resumes from " + db.describe() + " on the next start");
                Thread hook = new Thread(() -> {
                    try {
                        server.close();
                    } finally {
                        stopped.print();
                    }
                }, "tend-serve-stop");
                Runtime.getRuntime().addShutdownHook(hook);
                err.println("tend: serving " + server.url() + "/api/v1, the console on " + server.url() + "/"
                        + " (tokens: " + String.join(", ", tokens.names()) + "); stop with Ctrl-C or SIGTERM");
                err.flush();
                server.awaitStop();
                try {
                    Runtime.getRuntime().removeShutdownHook(hook);
                } catch (IllegalStateException shuttingDown) {
                    // a signal stopped us: the store is consistent, everything resumes on the next start
                }
                stopped.print();
            }
        }
        return ExitCodes.OK;
    }

    /** The topic of --kafka and --topic, or null without --kafka. */
    private dev.tend.stream.StreamSource stream() {
        if (kafka == null) {
            if (topic != null) throw new CommandLine.ParameterException(spec.commandLine(), "--topic goes with --kafka HOST:PORT");
            return null;
        }
        if (topic == null) throw new CommandLine.ParameterException(spec.commandLine(), "--kafka needs --topic TOPIC");
        try {
            return new dev.tend.stream.StreamSource(kafka, topic, group);
        } catch (IllegalArgumentException e) {
            throw new CommandLine.ParameterException(spec.commandLine(), e.getMessage());
        }
    }

    /**
     * Several instances on one PostgreSQL store: this one is a standby until it holds the
     * leader lease, then leads; see {@link LeaderLoop}.
     */
    private Integer serveShared(PrintWriter err, ServeSettings settings, Listen listen, Tokens tokens, LedgerKey key,
                                EngineSetup setup, Clock clock) throws InterruptedException {
        Duration ttl = dev.tend.shared.time.Durations.parse(lease);
        if (listen.port() == 0) {
            err.println("tend: with a PostgreSQL --db, give a fixed port (--listen HOST:PORT): standbys name the leader's address");
            return ExitCodes.USAGE;
        }
        String host = listen.host().contains(":") ? "[" + listen.host() + "]" : listen.host();
        String address = advertise != null ? advertise : (settings.tls() != null ? "https://" : "http://") + host + ":" + listen.port();
        String instance = java.net.URI.create(address).getAuthority() + "/" + ProcessHandle.current().pid();
        try (Store store = db.open()) {
            LeaderLoop loop = new LeaderLoop(store, settings, ttl, instance, address, server -> {
                server.store().useTransaction(tx -> tx.appendLedger(clock.instant(), LedgerKind.POLICY_LOADED.wire(), PolicyOptions.loaded(setup)));
                if (key != null) server.checkpointWith(server.store(), key);
                err.println("tend: serving " + server.url() + "/api/v1, the console on " + server.url() + "/"
                        + " (tokens: " + String.join(", ", tokens.names()) + "); stop with Ctrl-C or SIGTERM");
                err.flush();
            });
            StopLine stopped = new StopLine(err, "tend: stopped; everything resumes from " + db.describe() + " on the next start");
            Thread hook = new Thread(() -> {
                try {
                    loop.close();
                } finally {
                    stopped.print();
                }
            }, "tend-serve-stop");
            Runtime.getRuntime().addShutdownHook(hook);
            loop.run();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // a signal stopped us
            }
            stopped.print();
        }
        return ExitCodes.OK;
    }
}
