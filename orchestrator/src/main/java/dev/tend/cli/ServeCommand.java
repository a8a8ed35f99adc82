package dev.tend.cli;

import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.audit.LedgerKey;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
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
    ListenOptions listenOptions;

    @Option(names = "--tokens", paramLabel = "FILE",
            description = "bearer tokens (YAML: name, roles, sha256 of the token); without it every API request is refused")
    Path tokensFile;

    @Option(names = "--speedup", defaultValue = "1", paramLabel = "N",
            description = "run simulated actions N times faster than their durations (default: ${DEFAULT-VALUE})")
    double speedup;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "N", description = "seed of simulated outcomes (default: ${DEFAULT-VALUE})")
    long seed;

    @Mixin
    LedgerKeyOption ledgerKey;

    @Option(names = "--allow-host", paramLabel = "NAME",
            description = "a name clients reach the server by (the Host header) besides localhost and the address listened on;"
                    + " repeat for several")
    java.util.List<String> allowHosts = new java.util.ArrayList<>();

    @Option(names = "--tls-cert", paramLabel = "FILE",
            description = "serve HTTPS with this PEM certificate chain (the server's first); read again when it changes")
    Path tlsCert;

    @Option(names = "--tls-key", paramLabel = "FILE",
            description = "the unencrypted PKCS#8 PEM key of --tls-cert (readable by its owner only); read again when it changes")
    Path tlsKey;

    @Option(names = "--tls-check-every", paramLabel = "D", defaultValue = "10s",
            description = "how often the TLS files are looked at for a change (default: ${DEFAULT-VALUE})")
    String tlsCheckEvery;

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
        String warning = ListenSecurity.check(listen, tlsCert != null, insecureHttp);
        if (warning != null) err.println(warning);
        EngineSetup setup = policy.setup(EventTimeMode.following(EVENT_TIME_LAG));
        Tokens tokens = tokensFile == null ? Tokens.none() : TokenFile.load(tokensFile);
        LedgerKey key = ledgerKey.load();
        if (tokens.isEmpty()) err.println("tend: no --tokens given: every API request will be refused (401)");
        Clock clock = Clock.systemUTC();
        ServeSettings settings = ServeSettings.builder(setup).listen(listen.host(), listen.port()).tokens(tokens)
                .speedup(speedup).seed(seed).log(err).allowHosts(allowHosts)
                .tls(tlsCert == null ? null : new TlsFiles(tlsCert, tlsKey, checkEvery)).build();
        try (Store store = db.open()) {
            store.useTransaction(tx -> tx.appendLedger(clock.instant(), LedgerKind.POLICY_LOADED.wire(), PolicyOptions.loaded(setup)));
            try (TendServer server = TendServer.start(store, settings)) {
                if (key != null) server.checkpointWith(store, key);
                var rec = server.recovery();
                if (rec.inputsReplayed() > 0) {
                    err.println("tend: resumed from " + db.describe() + ": " + rec.inputsReplayed() + " journaled inputs replayed, "
                            + rec.timersArmed() + " timers armed, " + rec.callsAskedAgain() + " calls asked again by key, "
                            + rec.callsUnknown() + " runs stopped for a person");
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
}
