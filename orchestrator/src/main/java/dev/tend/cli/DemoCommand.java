package dev.tend.cli;

import dev.tend.api.auth.TokenFile;
import dev.tend.demo.DemoFeeder;
import dev.tend.demo.DemoLibrary;
import dev.tend.demo.DemoScript;
import dev.tend.demo.DemoTokens;
import dev.tend.engine.BrakeThresholds;
import dev.tend.engine.EngineSetup;
import dev.tend.engine.EventTimeMode;
import dev.tend.engine.LedgerKind;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.serve.ServeSettings;
import dev.tend.serve.TendServer;
import dev.tend.serve.TimeScale;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.shared.time.Durations;
import dev.tend.store.LedgerEntry;
import dev.tend.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.concurrent.Callable;

/**
 * {@code tend demo}: the Larkspur demo fleet (invented) with the bundled playbooks, scripted
 * incidents replayed round after round in accelerated time, the simulated executors, and the
 * server with its console on localhost, on a fresh store in a temporary folder unless
 * {@code --db}. Prints the URL, new random tokens and three things to try; runs until
 * interrupted (or for {@code --for D}, for tests).
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = "Run the invented Larkspur demo fleet with scripted incidents in accelerated time, the orchestrator"
                + " and the web console on localhost; stop with Ctrl-C.")
public final class DemoCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    ListenOptions listenOptions;

    @Option(names = "--speedup", defaultValue = "10", paramLabel = "N",
            description = "demo time runs N times faster than the wall clock (default: ${DEFAULT-VALUE})")
    double speedup;

    @Option(names = "--db", paramLabel = "FILE", description = "the SQLite store (default: a new one in a temporary folder)")
    Path db;

    @Option(names = "--seed", defaultValue = "1", paramLabel = "N", description = "seed of the simulated outcomes (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--for", paramLabel = "D", description = "stop by itself after D (e.g. 5m); without it, run until Ctrl-C")
    String runFor;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        Listen listen = listenOptions.resolve();
        if (!listenOptions.isExplicit() && !ListenOptions.isFree(listen)) {
            err.println("tend demo: port " + listen.port() + " is taken (another tend?); listening on a free port instead"
                    + " (choose one with --port N)");
            listen = new Listen(listen.host(), 0);
        }
        if (!(speedup >= 1 && speedup <= TimeScale.MAX_FACTOR)) {
            throw usage("--speedup must be from 1 to " + (long) TimeScale.MAX_FACTOR + ", got " + speedup);
        }
        Duration limit = null;
        if (runFor != null) {
            try {
                limit = Durations.parse(runFor);
            } catch (IllegalArgumentException e) {
                throw usage("--for: " + e.getMessage());
            }
        }
        Path home = Files.createTempDirectory("tend-demo-");
        Path library = DemoLibrary.copyTo(home.resolve("library"));
        DemoTokens tokens = DemoTokens.random(new SecureRandom());
        Files.writeString(home.resolve("tokens.yaml"), tokens.toFileText());
        PlaybookSet set = PlaybookLoader.load(library);
        EngineSetup setup = new EngineSetup(set, set.config(), FleetFile.load(library.resolve("fleet.yaml")),
                BrakeThresholds.from(set.config().brake()), EventTimeMode.following(ServeCommand.EVENT_TIME_LAG));
        Path storeFile = db != null ? db : home.resolve("tend.db");
        try (Store store = Store.openSqlite(storeFile)) {
            Instant start = demoStart(store);
            TimeScale scale = TimeScale.accelerated(start, speedup);
            store.useTransaction(tx -> tx.appendLedger(start, LedgerKind.POLICY_LOADED.wire(), PolicyOptions.loaded(setup)));
            ServeSettings settings = ServeSettings.builder(setup).listen(listen.host(), listen.port())
                    .tokens(TokenFile.load(home.resolve("tokens.yaml"))).speedup(speedup).seed(seed).timeScale(scale)
                    .tick(Duration.ofSeconds(1)).workDir(home).log(err).build();
            try (TendServer server = TendServer.start(store, settings);
                 DemoFeeder feeder = new DemoFeeder(server.url(), tokens.script(), scale, start.plus(Duration.ofSeconds(30)),
                         DemoScript.larkspur(), err)) {
                feeder.start();
                printWelcome(out, server.url(), tokens, storeFile, scale, firstApprovalAfter(set, scale), limit);
                awaitEnd(server, limit, new StopLine(out, "tend demo: stopped; the store stays at " + storeFile));
            }
        }
        return ExitCodes.OK;
    }

    /**
     * Wall time from now until the critical cluster's silent node waits for a person: the
     * feeder's 30 s head start, the script's beat, the playbook's confirmation and the event
     * time lag of serve, all in demo time, divided by the speed-up.
     */
    static Duration firstApprovalAfter(PlaybookSet set, TimeScale scale) {
        Duration beat = DemoScript.larkspur().stream().filter(i -> i.name().equals("silent-critical-node"))
                .flatMap(i -> i.beats().stream()).map(DemoScript.Beat::after).min(Duration::compareTo).orElse(Duration.ZERO);
        Duration confirm = set.playbooks().stream().filter(p -> p.trigger().signal().value().equals("heartbeat"))
                .map(p -> p.trigger().confirmFor()).max(Duration::compareTo).orElse(Duration.ZERO);
        Duration demo = Duration.ofSeconds(30).plus(beat).plus(confirm).plus(ServeCommand.EVENT_TIME_LAG);
        return Duration.ofMillis((long) (demo.toMillis() / scale.factor()));
    }

    /** Now, or just after the store's last entry when an earlier demo's accelerated time ran ahead of the wall clock. */
    private static Instant demoStart(Store store) {
        Instant now = Instant.now().truncatedTo(ChronoUnit.SECONDS);
        Instant last = store.read(rd -> rd.ledgerHead().map(LedgerEntry::at).orElse(null));
        return last != null && !last.isBefore(now) ? last.plusSeconds(1).truncatedTo(ChronoUnit.SECONDS) : now;
    }

    private void awaitEnd(TendServer server, Duration limit, StopLine stopped) throws InterruptedException {
        Thread hook = new Thread(() -> {
            try {
                server.close();
            } finally {
                stopped.print();
            }
        }, "tend-demo-stop");
        Runtime.getRuntime().addShutdownHook(hook);
        if (limit != null) {
            Thread.sleep(limit.toMillis());
            server.close();
        }
        server.awaitStop();
        try {
            Runtime.getRuntime().removeShutdownHook(hook);
        } catch (IllegalStateException shuttingDown) {
            // Ctrl-C stopped us; the store is consistent
        }
        stopped.print();
    }

    private static void printWelcome(PrintWriter out, String url, DemoTokens tokens, Path storeFile, TimeScale scale,
                                     Duration firstApproval, Duration limit) {
        long roundMinutes = Math.round(DemoScript.ROUND.toSeconds() / scale.factor() / 60.0);
        long approvalMinutes = Math.round(30 * 60 / scale.factor() / 60.0);
        List<String> lines = List.of(
                "tend demo: Larkspur, an invented city transit data platform: 300 broker and coordination clusters in zones"
                        + " z-a, z-b, z-c. Every name and incident is made up.",
                "Demo time runs " + fmt(scale.factor()) + "x faster than the wall clock; the scripted incidents play again"
                        + " every " + Math.max(1, roundMinutes) + " min (silent nodes, owner-filled disks, a flapping heartbeat).",
                "",
                "  console   " + url + "/",
                "  tokens    approver and operator (" + DemoTokens.LEAD + "): " + tokens.lead(),
                "            viewer (" + DemoTokens.VIEWER + "):               " + tokens.viewer(),
                "",
                "Three things to try:",
                "  1. Sign in with the approver token and open Approvals: " + aboutFromNow(firstApproval) + " a node of a"
                        + " critical fares cluster goes silent and, once tend has confirmed it, waits there for a person (it"
                        + " lapses after about " + Math.max(1, approvalMinutes) + " min). Approve it, then watch it drain,"
                        + " replace and settle on Runs.",
                "  2. Open Ledger with kind 'verdict': the owner-filled disks on tickets-* are denied as masked, and the"
                        + " flapping heartbeat on dispatch-* is held as flapping instead of being replaced.",
                "  3. Engage the fleet brake on Fleet and watch the next silent node be held (fleet-brake); release it."
                        + " Then sign in with the viewer token: no buttons, and the server refuses a forged approval (403).",
                "",
                "The store is " + storeFile + " (`tend audit --db " + storeFile + "` reads it afterwards). "
                        + (limit == null ? "Stop with Ctrl-C." : "It stops by itself after " + Durations.format(limit)
                        + "; stop it earlier with Ctrl-C."));
        lines.forEach(out::println);
        out.flush();
    }

    private static String aboutFromNow(Duration d) {
        long seconds = Math.max(1, d.toSeconds());
        if (seconds < 90) return "about " + ((seconds + 9) / 10 * 10) + " s from now";
        return "about " + Math.round(seconds / 60.0) + " min from now";
    }

    private static String fmt(double d) {
        return d == Math.rint(d) ? String.valueOf((long) d) : String.valueOf(d);
    }

    private CommandLine.ParameterException usage(String message) {
        return new CommandLine.ParameterException(spec.commandLine(), message);
    }
}
