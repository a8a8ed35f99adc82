package dev.tend.cli;

import dev.tend.engine.LedgerKind;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.store.LedgerDraft;
import dev.tend.store.Store;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

/**
 * The training run the launchers make the class-data archive with (DEVELOPERS.md, "Cold
 * replay"): the commands users run cold, in one process, so that the archive holds the classes
 * of each. First the given tend command (a replay of a bundled recording), then a handover of
 * a small store made for it in a temporary folder (an hour of invented Larkspur entries: runs,
 * executor calls, verdicts, transitions, a loop stop, the brake), then an ingest of invented
 * transitions over the fleet into another store there ({@link #ingest}), then the folder is
 * deleted.
 * Before them it makes this jar's empty store, which new stores are copied from
 * ({@link Store#makeTemplate}). Prints nothing; exits with the first exit code that is not 0.
 * Not a command of tend.
 *
 * <p>Arguments: the tend command line of the first part.
 */
public final class ArchiveTraining {
    private static final Instant START = Instant.parse("2027-01-04T00:00:00Z");
    private static final int INGEST_LINES = 3_000;
    private static final String[] PLAYBOOKS = {"replace-silent-node", "restart-stopped-process", "rebalance-replica-lag"};

    private ArchiveTraining() {
    }

    public static void main(String[] args) throws IOException {
        System.exit(train(args));
    }

    /** Runs the three parts; returns the first exit code that is not 0, else 0. */
    static int train(String[] args) throws IOException {
        try {
            Store.makeTemplate(); // first: its migrations' classes go into the archive too, for stores made without one
        } catch (IOException | RuntimeException e) {
            // the folder cannot be written: new stores are made by the migrations, as without a template
        }
        PrintWriter none = new PrintWriter(Writer.nullWriter());
        int first = TendMain.run(args, none, none);
        Path dir = Files.createTempDirectory("tend-archive-training");
        try {
            Path db = dir.resolve("training.db");
            try (Store store = Store.openSqlite(db)) {
                List<LedgerDraft> hour = hour();
                store.useTransaction(tx -> tx.appendLedger(hour));
            }
            int second = TendMain.run(new String[]{"handover", "--db", db.toString(), "--since", START.toString(),
                    "--until", START.plus(Duration.ofHours(1)).toString()}, none, none);
            int third = ingest(args, dir, none);
            return first != 0 ? first : second != 0 ? second : third;
        } finally {
            try (Stream<Path> files = Files.walk(dir)) {
                for (Path p : files.sorted(Comparator.reverseOrder()).toList()) Files.deleteIfExists(p);
            }
        }
    }

    /**
     * The third part: an ingest of {@link #INGEST_LINES} transitions over the fleet of the first
     * part's command line (its {@code --fleet}, else the fleet file of its {@code --playbooks}
     * folder) into a fresh store, the hour before now (ingest refuses events ahead of the clock):
     * stopped processes that confirm and start runs, and reports that all is well.
     * Without it a fresh ingest loaded about 600 classes from the jar (the snapshot codec's,
     * the courier's, the scheduler's): 20 to 30 ms of its start (DEVELOPERS.md, "Cold replay").
     */
    static int ingest(String[] firstPart, Path dir, PrintWriter out) throws IOException {
        String playbooks = option(firstPart, "--playbooks");
        if (playbooks == null) return 0;
        String fleetOption = option(firstPart, "--fleet");
        Path fleetFile = fleetOption != null ? Path.of(fleetOption) : Path.of(playbooks, "fleet.yaml");
        if (!Files.isRegularFile(fleetFile)) return 0;
        List<ClusterSpec> clusters = new ArrayList<>(FleetFile.load(fleetFile).clusters());
        Path events = dir.resolve("events.jsonl");
        // the wall clock, as the ingest bounds event time by it
        Instant from = Instant.now().minus(Duration.ofHours(1)).truncatedTo(java.time.temporal.ChronoUnit.SECONDS);
        try (Writer w = Files.newBufferedWriter(events)) {
            for (int i = 0; i < INGEST_LINES; i++) {
                // an episode every 200 s: a process of one cluster stops, is reported every 30 s for 150 s
                // (past the 2 minutes it must last), then clears; between, other clusters report all is well
                int episode = i / 200;
                int second = i % 200;
                boolean problem = second % 30 == 0 && second <= 150 || second == 180;
                ClusterSpec c = clusters.get((problem ? episode * 13 : i * 7) % clusters.size());
                String node = c.nodes().get(problem ? 0 : i % c.nodes().size()).id().toString();
                String signal = problem ? "process-down" : i % 2 == 0 ? "cpu-high" : "heartbeat";
                String state = problem && second != 180 ? "breach" : "clear";
                w.write("{\"at\":\"" + from.plusSeconds(i) + "\",\"cluster\":\"" + c.id() + "\",\"node\":\"" + node
                        + "\",\"signal\":\"" + signal + "\",\"state\":\"" + state + "\"}\n");
            }
        }
        return TendMain.run(new String[]{"ingest", events.toString(), "--db", dir.resolve("ingest.db").toString(), "--playbooks", playbooks,
                "--fleet", fleetFile.toString(), "--speedup", "1000000"}, out, out);
    }

    private static String option(String[] args, String name) {
        for (int i = 0; i + 1 < args.length; i++) if (args[i].equals(name)) return args[i + 1];
        return null;
    }

    /** 3,000 entries, one every 1.2 s: mostly verdicts and transitions, a run started every 100 entries and ended later. */
    private static List<LedgerDraft> hour() {
        List<LedgerDraft> drafts = new ArrayList<>();
        for (int i = 0; i < 3000; i++) {
            Instant at = START.plusMillis(1200L * i);
            String cluster = "fares-" + (1 + i % 40);
            String playbook = PLAYBOOKS[i % PLAYBOOKS.length];
            String run = "r" + (i / 100);
            switch (i % 100) {
                case 0 -> drafts.add(draft(at, LedgerKind.RUN_STARTED, "run", run, "playbook", playbook, "version", 1, "cluster", cluster,
                        "node", "n1"));
                case 5 -> drafts.add(draft(at, LedgerKind.EXECUTOR_CALL, "run", run, "playbook", playbook, "cluster", cluster, "node", "n1",
                        "step", "act", "attempt", 1, "key", run + "/act/1", "action", "restart-node", "executor", "simulated",
                        "timeout", "PT10M"));
                case 20 -> drafts.add(draft(at, LedgerKind.EXECUTOR_RESULT, "run", run, "playbook", playbook, "cluster", cluster,
                        "step", "act", "attempt", 1, "success", true, "message", "done"));
                case 40 -> drafts.add(draft(at, LedgerKind.RUN_ENDED, "run", run, "playbook", playbook, "cluster", cluster, "node", "n1",
                        "state", i % 300 == 40 ? "failed" : "succeeded", "outcome", "done"));
                case 50 -> drafts.add(i == 1450
                        ? draft(at, LedgerKind.BRAKE_ENGAGED, "by", "automation", "reason", "12% of the fleet unhealthy",
                        "unhealthy_clusters", 5, "manual", false)
                        : draft(at, LedgerKind.LOOP_STOPPED, "playbook", playbook, "cluster", cluster, "node", "n2"));
                default -> drafts.add(i % 3 == 0
                        ? draft(at, LedgerKind.TRANSITION, "cluster", cluster, "node", "n" + (1 + i % 4), "signal", "heartbeat",
                        "state", i % 2 == 0 ? "breach" : "clear", "at_event", at.minusMillis(300).toString())
                        : draft(at, LedgerKind.VERDICT, "playbook", playbook, "cluster", cluster, "node", "n" + (1 + i % 4),
                        "verdict", i % 7 == 0 ? "deny" : "hold", "reasons", List.of(i % 7 == 0 ? "excluded" : "unconfirmed"),
                        "signal", "heartbeat"));
            }
        }
        return drafts;
    }

    private static LedgerDraft draft(Instant at, LedgerKind kind, Object... kv) {
        Map<String, Object> fields = new LinkedHashMap<>();
        for (int i = 0; i < kv.length; i += 2) fields.put((String) kv[i], kv[i + 1]);
        return LedgerDraft.of(at, kind.wire(), kind.check(fields));
    }
}
